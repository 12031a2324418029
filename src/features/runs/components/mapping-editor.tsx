import type { RunMapping } from '@shared/runlog/mapping';
import { CHANNEL_LABELS, CHANNEL_UNITS, RUN_CHANNELS, UNIT_LABELS, type RunChannel } from '@shared/runlog/vocabulary';

type Source = { column: string; unit: string; poles?: number };
export type DraftMapping = Partial<Record<RunChannel, Source>>;

const field = 'rounded-md border border-ink/25 bg-white px-2 py-1 text-sm';

/** Each of our channels ← one of the file's columns and its unit; the person confirms or edits the proposal. */
export function MappingEditor({ headers, mapping, onChange }: { headers: string[]; mapping: DraftMapping; onChange: (m: DraftMapping) => void }) {
  const set = (channel: RunChannel, next: Source | undefined) => {
    const copy = { ...mapping };
    if (next) copy[channel] = next;
    else delete copy[channel];
    onChange(copy);
  };
  return (
    <table className="w-full text-sm" data-testid="mapping-editor">
      <caption className="mb-2 text-left font-medium">Which column is which</caption>
      <thead>
        <tr className="text-left text-ink-muted">
          <th className="py-1 pr-2 font-medium">Our channel</th>
          <th className="py-1 pr-2 font-medium">Column in your file</th>
          <th className="py-1 font-medium">Its unit</th>
        </tr>
      </thead>
      <tbody>
        {RUN_CHANNELS.map((channel) => {
          const src = mapping[channel];
          const units = CHANNEL_UNITS[channel] as readonly string[];
          return (
            <tr key={channel} className="border-t border-ink/10">
              <th scope="row" className="py-1.5 pr-2 text-left font-normal">
                {CHANNEL_LABELS[channel].label} <code className="text-xs text-ink-muted">{channel}</code>
              </th>
              <td className="py-1.5 pr-2">
                <select
                  aria-label={`Column for ${CHANNEL_LABELS[channel].label}`}
                  className={`${field} max-w-[11rem]`}
                  value={src?.column ?? ''}
                  onChange={(e) => set(channel, e.target.value ? { column: e.target.value, unit: src?.unit ?? units[0], poles: src?.poles } : undefined)}
                >
                  <option value="">{channel === 'time_s' ? '— choose —' : '— not in this file —'}</option>
                  {headers.map((h) => (
                    <option key={h} value={h}>
                      {h}
                    </option>
                  ))}
                </select>
              </td>
              <td className="py-1.5">
                {src && (
                  <span className="flex flex-wrap items-center gap-1">
                    <select
                      aria-label={`Unit for ${CHANNEL_LABELS[channel].label}`}
                      className={field}
                      value={src.unit}
                      onChange={(e) => set(channel, { ...src, unit: e.target.value })}
                    >
                      {units.map((u) => (
                        <option key={u} value={u}>
                          {UNIT_LABELS[u] ?? u}
                        </option>
                      ))}
                    </select>
                    {src.unit === 'erpm' && (
                      <input
                        aria-label="Motor pole count"
                        type="number"
                        min={2}
                        max={24}
                        step={2}
                        placeholder="poles"
                        className={`${field} w-20`}
                        value={src.poles ?? ''}
                        onChange={(e) => set(channel, { ...src, poles: e.target.value ? Number(e.target.value) : undefined })}
                      />
                    )}
                  </span>
                )}
              </td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}

/** The mapping as the API takes it (channels left out where no column is chosen). */
export function toMapping(draft: DraftMapping): RunMapping {
  return draft as RunMapping;
}
