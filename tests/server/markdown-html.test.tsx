import { renderToStaticMarkup } from 'react-dom/server';
import { fromHtml } from 'hast-util-from-html';
import { toHtml } from 'hast-util-to-html';
import { visit } from 'unist-util-visit';
import { describe, expect, it } from 'vitest';
import { resolveParameterHref } from '../../shared/markdown/links';
import { renderMarkdownHtml } from '../../server/lib/markdown-html';
import { Markdown } from '../../src/lib/markdown';
import { XSS_CORPUS } from '../setup/xss';

const IMG = '6f1c2a3b-4d5e-4f60-8a7b-9c0d1e2f3a4b';

/** Parsed and written out again, so two renderers' output compares by content, not by serialization. */
function normalize(html: string) {
  const tree = fromHtml(html.replace(/>\s+</g, '><'), { fragment: true });
  visit(tree, 'element', (el) => {
    el.properties = Object.fromEntries(Object.entries(el.properties).sort(([a], [b]) => a.localeCompare(b)));
  });
  return toHtml(tree);
}

/** Every attribute that could run script or leave the site. */
function dangerous(html: string): string[] {
  const found: string[] = [];
  for (const m of html.matchAll(/<([a-z0-9]+)\b([^>]*)>/gi)) {
    const [, tag, attrs] = m;
    if (/^(script|iframe|object|embed|style|svg|math|meta|form|input|details|img)$/i.test(tag) && !/^img$/i.test(tag)) found.push(`<${tag}>`);
    if (/\son[a-z]+\s*=/i.test(attrs)) found.push(`${tag} handler`);
    if (/\sstyle\s*=/i.test(attrs)) found.push(`${tag} style`);
    for (const u of attrs.matchAll(/\s(?:href|src|action|xlink:href|srcdoc)\s*=\s*"([^"]*)"/gi))
      if (!/^(https?:\/\/|\/|#|[a-z0-9-]+$|[^:]*$)/i.test(u[1])) found.push(`${tag} url ${u[1]}`);
  }
  return found;
}

describe('renderMarkdownHtml (reader pages, rendered on the server)', () => {
  it('renders GFM: headings, emphasis, lists, tables (in a scrolling wrapper), code', () => {
    const html = renderMarkdownHtml('## Gearing\n\nUse **84** spur.\n\n- one\n- two\n\n| a | b |\n|---|---|\n| 1 | 2 |\n\n`code`\n');
    expect(html).toContain('<h2>Gearing</h2>');
    expect(html).toContain('<strong>84</strong>');
    expect(html).toMatch(/<ul>\s*<li>one<\/li>\s*<li>two<\/li>\s*<\/ul>/);
    expect(html).toMatch(/<div class="table-scroll"><table>[\s\S]*<td>2<\/td>[\s\S]*<\/table><\/div>/);
    expect(html).toContain('<code>code</code>');
  });

  it('turns each worked-example block into a numbered slot that still holds its source text', () => {
    const html = renderMarkdownHtml('Text\n\n```worked-example\ncalc: gearing\nspur: 84\n```\n\n```worked-example\ncalc: pack\n```\n\n```yaml\na: 1\n```\n');
    expect(html).toContain(
      '<div class="worked-example-slot" data-example-slot="0"><pre><code class="language-worked-example">calc: gearing\nspur: 84\n</code></pre></div>',
    );
    expect(html).toContain('data-example-slot="1"');
    expect(html).not.toContain('data-example-slot="2"'); // an ordinary code block stays code
    expect(html).toContain('<code class="language-yaml">');
  });

  it('keeps only http(s) and relative links; external ones open without opener or referrer', () => {
    const html = renderMarkdownHtml(
      '[a](https://example.org/x) [b](/guides/x) [c](javascript:alert(1)) [d](//evil.example) [e](data:text/html,x) [f](drag-brake)',
    );
    expect(html).toContain('<a href="https://example.org/x" rel="noopener noreferrer nofollow" target="_blank">a</a>');
    expect(html).toContain('<a href="/guides/x">b</a>');
    expect(html).toContain('<span>c</span>');
    expect(html).toContain('<span>d</span>');
    expect(html).toContain('<span>e</span>');
    expect(html).toContain('<a href="drag-brake">f</a>');
  });

  it('rewrites bare slugs to parameter entries when asked (parameter bodies)', () => {
    const html = renderMarkdownHtml('[drag brake](drag-brake) [page](/setups)', { resolveHref: resolveParameterHref });
    expect(html).toContain('<a href="/parameters/drag-brake">drag brake</a>');
    expect(html).toContain('<a href="/setups">page</a>');
  });

  it('shows our own images with their size, srcset and lazy loading, drops every other image, and puts a notice where one is hidden', () => {
    const html = renderMarkdownHtml(`![Endbell mark](/api/images/${IMG}/960#2000x1500)\n\n![Elsewhere](https://example.org/a.jpg)`);
    const img = /<img [^>]*>/.exec(html)?.[0] ?? '';
    expect(img).toContain(`src="/api/images/${IMG}/960"`);
    expect(img).toContain('alt="Endbell mark"');
    // 960 of 2000 × 1500 wide: 720 high.
    expect(img).toContain('width="960"');
    expect(img).toContain('height="720"');
    expect(img).toContain(`srcset="/api/images/${IMG}/480 480w, /api/images/${IMG}/960 960w, /api/images/${IMG}/1600 1600w"`);
    expect(img).toContain('loading="lazy"');
    expect(html).not.toContain('example.org');
    expect(html).toContain('<span>Elsewhere</span>');
    const hidden = renderMarkdownHtml(`![Endbell mark](/api/images/${IMG}/960#2000x1500)`, { hiddenImages: new Set([IMG]) });
    expect(hidden).not.toContain('<img');
    expect(hidden).toContain('A moderator has hidden this image.');
  });

  it.each(XSS_CORPUS.map((p, i) => [i, p]))('leaves nothing that can run script in hostile piece %i', (_i, payload) => {
    const html = renderMarkdownHtml(`Before\n\n${payload}\n\nAfter`);
    expect(dangerous(html), html).toEqual([]);
    expect(html).toContain('After');
  });

  // The reader page (server HTML) and the author's live preview (react-markdown in the browser) must
  // show the same thing, or a moderator would approve something other than what readers get.
  it.each([
    ['prose', '# Title\n\nSome *text* with a [link](https://example.org) and `code`.\n\n> quote\n\n1. one\n2. two\n'],
    ['table', '| Setting | Value |\n|---|---:|\n| Drag brake | 8 % |\n'],
    ['task list and strike', '- [x] done\n- [ ] open\n\n~~old~~ new\n'],
    ['hostile', XSS_CORPUS.filter((p) => !p.includes('worked-example')).join('\n\n')],
    [
      'images',
      `![Endbell mark](/api/images/${IMG}/960#2000x1500)\n\n![](/api/images/${IMG}/480)\n\n![far away](https://example.org/a.jpg) ![rel](pictures/a.png) ![data](data:image/png;base64,AAAA)\n`,
    ],
  ])('matches the browser renderer for %s', (_name, md) => {
    const browser = renderToStaticMarkup(<Markdown className="x">{md}</Markdown>);
    const server = `<div class="x">${renderMarkdownHtml(md)}</div>`;
    expect(normalize(server)).toBe(normalize(browser));
  });
});
