import { Children, isValidElement, type ReactElement, type ReactNode } from 'react';
import ReactMarkdown, { type Components } from 'react-markdown';
import remarkGfm from 'remark-gfm';
import rehypeSanitize from 'rehype-sanitize';
import { isExternalHref, safeHref, sanitizeSchema, WORKED_EXAMPLE_LANGUAGE } from '@shared/markdown/safety';
import { imageAttributes } from '@shared/markdown/images';
import { TableScroll } from '@/components/ui/table-scroll';

// No raw HTML ever reaches the page: react-markdown does not parse it, and the shared schema strips what remains.
export const rehypePlugins = [[rehypeSanitize, sanitizeSchema]] as const;

function codeText(node: ReactNode): string {
  if (typeof node === 'string') return node;
  if (Array.isArray(node)) return node.map(codeText).join('');
  if (isValidElement(node)) return codeText((node as ReactElement<{ children?: ReactNode }>).props.children);
  return '';
}

export type MarkdownProps = {
  children: string;
  /** Renders a ```worked-example block; without it the block shows as code. */
  renderWorkedExample?: (body: string, index: number) => ReactNode;
  /** Rewrites relative links (e.g. parameter slugs to /parameters/<slug>). */
  resolveHref?: (href: string) => string;
  className?: string;
};

/** Markdown as the product renders it everywhere: GFM, sanitized, with live worked-example blocks. */
export function Markdown({ children, renderWorkedExample, resolveHref, className = 'prose-notebook' }: MarkdownProps) {
  let exampleIndex = 0;
  const components: Components = {
    pre({ children: preChildren }) {
      const only = Children.toArray(preChildren)[0];
      if (renderWorkedExample && isValidElement(only)) {
        const props = (only as ReactElement<{ className?: string; children?: ReactNode }>).props;
        if (props.className?.split(/\s+/).includes(`language-${WORKED_EXAMPLE_LANGUAGE}`)) {
          return <>{renderWorkedExample(codeText(props.children), exampleIndex++)}</>;
        }
      }
      return <pre>{preChildren}</pre>;
    },
    a({ href, children: linkChildren }) {
      const safe = safeHref(href);
      if (!safe) return <span>{linkChildren}</span>;
      const external = isExternalHref(safe);
      const target = !external && resolveHref ? resolveHref(safe) : safe;
      return external ? (
        <a href={target} rel="noopener noreferrer nofollow" target="_blank">
          {linkChildren}
        </a>
      ) : (
        <a href={target}>{linkChildren}</a>
      );
    },
    img({ src, alt }) {
      // Only our own processed images (with their size, srcset and lazy loading); anything else leaves its alt text.
      const attrs = imageAttributes(typeof src === 'string' ? src : undefined, alt ?? '');
      return attrs ? <img {...attrs} /> : <span>{alt}</span>;
    },
    table({ children: tableChildren }) {
      return (
        <TableScroll label="Table">
          <table>{tableChildren}</table>
        </TableScroll>
      );
    },
  };
  return (
    <div className={className}>
      <ReactMarkdown remarkPlugins={[remarkGfm]} rehypePlugins={rehypePlugins as never} components={components}>
        {children}
      </ReactMarkdown>
    </div>
  );
}
