import { Dialog } from '@/components/ui/dialog';
import { Button } from '@/components/ui/button';

const rows: Array<[string, string]> = [
  ['## Heading', 'A section heading (### for a sub-section). Start sections at ##: the title is the page’s only top heading.'],
  ['**bold**, _italic_', 'Emphasis, sparingly.'],
  ['- item / 1. item', 'A list: one item per line, a blank line before the list.'],
  ['[words](/parameters/drag-brake)', 'A link. Links to our own pages start with /; links elsewhere open as plain links.'],
  ['| A | B |\\n| --- | --- |\\n| 1 | 2 |', 'A table: a header row, a row of dashes, then one row per line.'],
  [
    '> **Caution:** …',
    'A caution, for anything that can damage equipment or hurt someone (heat, packs, spinning parts). Put it beside the example it is about.',
  ],
];

/**
 * Our help for the guide body: the Markdown a guide uses and the worked-example block. It is part of
 * the app, so it works offline and never sends the author elsewhere.
 */
export function MarkdownHelp({ open, onClose }: { open: boolean; onClose: () => void }) {
  return (
    <Dialog
      open={open}
      onClose={onClose}
      title="Writing the body"
      footer={
        <Button variant="secondary" onClick={onClose}>
          Close
        </Button>
      }
    >
      <div className="flex flex-col gap-3 text-sm" data-testid="markdown-help">
        <table className="w-full border-collapse text-left">
          <thead>
            <tr className="border-b border-paper-line">
              <th className="py-1 pr-3 font-semibold">Type</th>
              <th className="py-1 font-semibold">What it gives</th>
            </tr>
          </thead>
          <tbody>
            {rows.map(([code, text]) => (
              <tr key={code} className="border-b border-paper-line/60 align-top">
                <td className="py-1 pr-3">
                  <code className="whitespace-pre-wrap">{code.replace(/\\n/g, '\n')}</code>
                </td>
                <td className="py-1">{text}</td>
              </tr>
            ))}
          </tbody>
        </table>
        <h3 className="font-semibold">Worked examples</h3>
        <p>
          A worked example is a fenced block whose first line is <code>```worked-example</code>. Inside, a <code>calc:</code> line names the calculator and each
          further line gives one of its inputs as <code>name: value</code>; it ends with <code>```</code>. Readers see a live card with the result and can
          change the numbers. “Insert worked example” in the toolbar writes the block for you from a form, and every calculator page has “Use in a guide”, which
          copies one.
        </p>
        <pre className="overflow-x-auto rounded bg-paper-card p-2 text-xs">
          {'```worked-example\ncalc: gearing\nspur: 84\npinion: 40\ninternalRatio: 1.9\ntyreDiameterMm: 64\n```'}
        </pre>
        <p>
          Every save runs the automatic checks: an example’s numbers are checked against the baseline setup and the calculators, and a result that needs a
          caution asks for one nearby.
        </p>
      </div>
    </Dialog>
  );
}
