import type { ReactNode } from 'react';
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
  return (
    <div data-color-mode="light" className="tw-md-editor">
      <MDEditor
        value={value}
        onChange={(v) => onChange(v ?? '')}
        height={520}
        preview="live"
        visibleDragbar
        textareaProps={{ id, 'aria-describedby': describedBy, spellCheck: true, placeholder: 'Write the guide in Markdown: ## headings, lists, tables and ```worked-example blocks.' }}
        previewOptions={{ rehypePlugins: [[rehypeSanitize]] }}
        components={{ preview: (source) => <Markdown renderWorkedExample={renderWorkedExample}>{source}</Markdown> }}
      />
    </div>
  );
}
