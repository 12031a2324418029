import { useEffect, useRef, type ReactNode } from 'react';
import MDEditor from '@uiw/react-md-editor/nohighlight';
import rehypeSanitize from 'rehype-sanitize';
import { Markdown } from '@/lib/markdown';

export type MarkdownEditorProps = {
  id: string;
  value: string;
  onChange: (value: string) => void;
  renderWorkedExample?: (body: string, index: number) => ReactNode;
  describedBy?: string;
};

/**
 * The Markdown editor itself (a large chunk, so it is only ever imported lazily). Its preview is our own
 * sanitized renderer, so authors see exactly what readers will, worked examples included.
 */
export default function MarkdownEditor({ id, value, onChange, renderWorkedExample, describedBy }: MarkdownEditorProps) {
  const wrap = useRef<HTMLDivElement>(null);
  // The editor's toolbar icons are drawn as role="img" without a name (the buttons carry the label),
  // and its preview pane scrolls without being focusable; patch both so keyboard and screen-reader users get through.
  useEffect(() => {
    const root = wrap.current;
    if (!root) return;
    const patch = () => {
      root.querySelectorAll('.w-md-editor-toolbar svg:not([aria-hidden])').forEach((svg) => svg.setAttribute('aria-hidden', 'true'));
      const preview = root.querySelector('.w-md-editor-preview');
      if (preview && !preview.hasAttribute('tabindex')) {
        preview.setAttribute('tabindex', '0');
        preview.setAttribute('role', 'region');
        preview.setAttribute('aria-label', 'Preview as readers will see it');
      }
    };
    patch();
    const observer = new MutationObserver(patch);
    observer.observe(root, { childList: true, subtree: true });
    return () => observer.disconnect();
  }, []);
  return (
    <div ref={wrap} data-color-mode="light" className="tw-md-editor">
      <MDEditor
        value={value}
        onChange={(v) => onChange(v ?? '')}
        height={520}
        preview={typeof window !== 'undefined' && window.matchMedia('(min-width: 768px)').matches ? 'live' : 'edit'}
        visibleDragbar
        textareaProps={{
          id,
          'aria-describedby': describedBy,
          spellCheck: true,
          placeholder: 'Write the guide in Markdown: ## headings, lists, tables and ```worked-example blocks.',
        }}
        previewOptions={{ rehypePlugins: [[rehypeSanitize]] }}
        components={{ preview: (source) => <Markdown renderWorkedExample={renderWorkedExample}>{source}</Markdown> }}
      />
    </div>
  );
}
