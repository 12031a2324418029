import { useEffect, useRef, type ReactNode } from 'react';
import MDEditor, { commands, type ICommand } from '@uiw/react-md-editor/nohighlight';
import rehypeSanitize from 'rehype-sanitize';
import { Markdown } from '@/lib/markdown';

export type MarkdownEditorProps = {
  id: string;
  value: string;
  onChange: (value: string) => void;
  renderWorkedExample?: (body: string, index: number) => ReactNode;
  describedBy?: string;
  /** The toolbar's "Insert worked example": called with where the cursor is (the page opens its form). */
  onInsertExample?: (at: number) => void;
  /** The toolbar's help: our own help for the body, inside the app. */
  onHelp?: () => void;
};

const icon = (text: string) => (
  <span aria-hidden="true" className="px-0.5 text-[0.7rem] font-semibold">
    {text}
  </span>
);

/**
 * Only the actions a guide needs: headings, emphasis, lists, links, tables, worked example, caution,
 * and our own help (the library's default adds images, code, quotes and a help link to another site).
 */
function toolbar(onInsertExample?: (at: number) => void, onHelp?: () => void): ICommand[] {
  const caution: ICommand = {
    name: 'caution',
    keyCommand: 'caution',
    buttonProps: { 'aria-label': 'Insert a caution', title: 'Insert a caution' },
    icon: icon('⚠ Caution'),
    execute: (state, api) => {
      const start = state.text.lastIndexOf('\n', state.selection.start - 1) + 1;
      api.setSelectionRange({ start, end: start });
      api.replaceSelection('> **Caution:** ');
    },
  };
  const example: ICommand = {
    name: 'worked-example',
    keyCommand: 'worked-example',
    buttonProps: { 'aria-label': 'Insert worked example', title: 'Insert worked example' },
    icon: icon('Worked example'),
    execute: (state) => onInsertExample?.(state.selection.end),
  };
  const help: ICommand = {
    name: 'help',
    keyCommand: 'help',
    buttonProps: { 'aria-label': 'Writing help', title: 'Writing help' },
    icon: icon('Help'),
    execute: () => onHelp?.(),
  };
  return [
    commands.title2,
    commands.title3,
    commands.bold,
    commands.italic,
    commands.divider,
    commands.unorderedListCommand,
    commands.orderedListCommand,
    commands.link,
    commands.table,
    commands.divider,
    example,
    caution,
    commands.divider,
    help,
  ];
}

/**
 * The Markdown editor itself (a large chunk, so it is only ever imported lazily). Its preview is our own
 * sanitized renderer, so authors see exactly what readers will, worked examples included.
 */
export default function MarkdownEditor({ id, value, onChange, renderWorkedExample, describedBy, onInsertExample, onHelp }: MarkdownEditorProps) {
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
        commands={toolbar(onInsertExample, onHelp)}
        extraCommands={[commands.codeEdit, commands.codeLive, commands.codePreview]}
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
