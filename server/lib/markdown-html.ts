import type { Element, ElementContent, Root } from 'hast';
import rehypeSanitize from 'rehype-sanitize';
import rehypeStringify from 'rehype-stringify';
import remarkGfm from 'remark-gfm';
import remarkParse from 'remark-parse';
import remarkRehype from 'remark-rehype';
import { unified } from 'unified';
import { visit } from 'unist-util-visit';
import { isExternalHref, safeHref, sanitizeSchema, WORKED_EXAMPLE_LANGUAGE } from '../../shared/markdown/safety';
import { HIDDEN_IMAGE_NOTICE, imageAttributes, parseImageSrc } from '../../shared/markdown/images';

export type RenderOptions = {
  /** Rewrites relative links (e.g. a parameter slug to /parameters/<slug>). */
  resolveHref?: (href: string) => string;
  /** Images a moderator has hid: a notice stands in their place. */
  hiddenImages?: ReadonlySet<string>;
};

const classes = (el: Element): string[] => {
  const c: unknown = el.properties.className;
  return Array.isArray(c) ? c.map(String) : typeof c === 'string' ? c.split(/\s+/) : [];
};

/**
 * After sanitizing: worked-example blocks become numbered slots (data-example-slot) (the page mounts the live card
 * there; without script the block still reads as text), links keep only safe targets, tables scroll, column alignment is a style.
 */
function readerShape(opts: RenderOptions) {
  return (tree: Root) => {
    let example = 0;
    visit(tree, 'element', (el) => {
      if ((el.tagName === 'th' || el.tagName === 'td') && typeof el.properties.align === 'string') {
        // Column alignment as the browser renderer writes it (a style, not the obsolete attribute).
        const align = el.properties.align;
        delete el.properties.align;
        if (['left', 'right', 'center'].includes(align)) el.properties.style = `text-align:${align}`;
      }
    });
    visit(tree, 'element', (el, index, parent) => {
      if (!parent || index === undefined) return;
      if (el.tagName === 'pre') {
        const code = el.children.find((c): c is Element => c.type === 'element' && c.tagName === 'code');
        if (code && classes(code).includes(`language-${WORKED_EXAMPLE_LANGUAGE}`)) {
          const slot: Element = {
            type: 'element',
            tagName: 'div',
            properties: { className: ['worked-example-slot'], dataExampleSlot: String(example++) },
            children: [el],
          };
          parent.children[index] = slot;
          return 'skip';
        }
      }
      if (el.tagName === 'a') {
        const href = safeHref(typeof el.properties.href === 'string' ? el.properties.href : undefined);
        if (!href) {
          parent.children[index] = { type: 'element', tagName: 'span', properties: {}, children: el.children };
          return;
        }
        el.properties = isExternalHref(href)
          ? { href, rel: ['noopener', 'noreferrer', 'nofollow'], target: '_blank' }
          : { href: opts.resolveHref ? opts.resolveHref(href) : href };
      }
      if (el.tagName === 'img') {
        const src = typeof el.properties.src === 'string' ? el.properties.src : undefined;
        const alt = typeof el.properties.alt === 'string' ? el.properties.alt : '';
        const ref = parseImageSrc(src);
        if (ref && opts.hiddenImages?.has(ref.id)) {
          parent.children[index] = {
            type: 'element',
            tagName: 'span',
            properties: { className: ['image-hidden'] },
            children: [{ type: 'text', value: HIDDEN_IMAGE_NOTICE }],
          };
          return;
        }
        const attrs = imageAttributes(src, alt);
        // Not one of ours: dropped (the alt text stays as text), exactly as the browser renderer does.
        parent.children[index] = attrs
          ? { type: 'element', tagName: 'img', properties: { ...attrs }, children: [] }
          : { type: 'element', tagName: 'span', properties: {}, children: alt ? [{ type: 'text', value: alt }] : [] };
        return;
      }
      if (el.tagName === 'table' && !(parent.type === 'element' && classes(parent).includes('table-scroll'))) {
        // The frame TableScroll draws before it has measured the table (src/components/ui/table-scroll.tsx).
        const scroller: ElementContent = { type: 'element', tagName: 'div', properties: { className: ['table-scroll'] }, children: [el as ElementContent] };
        parent.children[index] = { type: 'element', tagName: 'div', properties: { className: ['min-w-0'] }, children: [scroller] };
        return 'skip';
      }
    });
  };
}

/**
 * Markdown to the HTML readers get: GFM, raw HTML never parsed (it stays text), sanitized with the
 * shared schema before anything of ours is added. Same rules as the browser's live preview.
 */
export function renderMarkdownHtml(markdown: string, opts: RenderOptions = {}): string {
  const processor = unified().use(remarkParse).use(remarkGfm).use(remarkRehype).use(rehypeSanitize, sanitizeSchema).use(readerShape, opts).use(rehypeStringify);
  return String(processor.processSync(markdown));
}
