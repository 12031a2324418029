import type { SetupRecord } from '@shared/schemas/setup-record';
import { flattenSetup, SETUP_SECTIONS } from '@shared/setup/fields';
import { useUnits } from '@/lib/preferences';
import { showValue } from './labels';

/** Every field of a record, section by section (the body of the print sheet). */
export function RecordTable({ record, names }: { record: SetupRecord; names?: Record<string, string> }) {
  const units = useUnits();
  const leaves = flattenSetup(record, names).filter((l) => l.section !== 'provenance' && l.section !== 'notes');
  return (
    <div className="grid gap-x-8 gap-y-4 sm:grid-cols-2 print:grid-cols-2">
      {SETUP_SECTIONS.filter((s) => leaves.some((l) => l.section === s.key)).map((section) => (
        <section key={section.key} className="break-inside-avoid">
          <h3 className="mb-1 border-b border-ink/30 text-sm font-semibold tracking-wide uppercase">{section.title}</h3>
          <table className="w-full text-sm">
            <tbody>
              {leaves
                .filter((l) => l.section === section.key)
                .map((l) => (
                  <tr key={l.path} className="border-b border-paper-line print:border-black/20">
                    <th scope="row" className="py-1 pr-3 text-left font-normal text-ink-soft print:text-black">
                      {l.label}
                    </th>
                    <td className="py-1 text-right font-medium tabular-nums">{showValue(l.path, l.value, l.unit, units)}</td>
                  </tr>
                ))}
            </tbody>
          </table>
        </section>
      ))}
    </div>
  );
}
