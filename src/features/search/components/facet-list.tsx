import { useState } from 'react';
import type { FacetValue } from '@shared/schemas/search';

/** One facet's values with their counts, as toggle buttons (the first six, then "Show all"). */
export function FacetList({
  label,
  values,
  selected,
  onSelect,
}: {
  label: string;
  values: FacetValue[];
  selected?: string;
  onSelect: (v: string | undefined) => void;
}) {
  const [more, setMore] = useState(false);
  if (!values.length && !selected) return null;
  const shown = more ? values : values.slice(0, 6);
  return (
    <fieldset className="border-b border-paper-line pb-4 last:border-b-0">
      <legend className="mb-2 text-xs font-semibold tracking-wider text-ink-muted uppercase">{label}</legend>
      <ul className="flex flex-col gap-0.5">
        {shown.map((v) => {
          const on = v.value === selected;
          return (
            <li key={v.value}>
              <button
                type="button"
                aria-pressed={on}
                onClick={() => onSelect(on ? undefined : v.value)}
                className={`flex w-full items-center justify-between gap-2 rounded px-2 py-1 text-left text-sm ${on ? 'bg-ink text-paper' : 'text-ink hover:bg-paper-deep'}`}
              >
                <span className="min-w-0 truncate">{v.label}</span>
                <span className={`tabular-nums text-xs ${on ? 'text-paper/80' : 'text-ink-muted'}`}>{v.count}</span>
              </button>
            </li>
          );
        })}
      </ul>
      {values.length > 6 && (
        <button type="button" className="mt-1 px-2 text-xs font-medium text-copper-dark underline" onClick={() => setMore((m) => !m)}>
          {more ? 'Show fewer' : `Show all ${values.length}`}
        </button>
      )}
    </fieldset>
  );
}
