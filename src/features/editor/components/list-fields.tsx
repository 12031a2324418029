import { useEffect, useId, useMemo, useState } from 'react';
import { PARAMETER_CATEGORIES } from '@shared/constants';
import type { ParameterSummary } from '@shared/schemas/parameter';
import { TextField } from '@/components/ui/field';

/** Splits "stock, 17.5T, 2S" into clean entries (empty ones and repeats dropped). */
export function splitList(text: string): string[] {
  const seen = new Set<string>();
  const out: string[] = [];
  for (const part of text.split(',')) {
    const t = part.trim();
    if (t && !seen.has(t.toLowerCase())) {
      seen.add(t.toLowerCase());
      out.push(t);
    }
  }
  return out;
}

/** A comma-separated list typed as text; the text is kept as typed so a trailing comma does not vanish. */
export function CommaListField({
  label,
  hint,
  value,
  onChange,
  error,
}: {
  label: string;
  hint?: string;
  value: string[];
  onChange: (v: string[]) => void;
  error?: string;
}) {
  const [text, setText] = useState(value.join(', '));
  useEffect(() => {
    // Only follow outside changes (a restored draft), not our own keystrokes.
    if (splitList(text).join('\u0000') !== value.join('\u0000')) setText(value.join(', '));
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [value]);
  return (
    <TextField
      label={label}
      hint={hint}
      error={error}
      value={text}
      onChange={(e) => {
        setText(e.target.value);
        onChange(splitList(e.target.value));
      }}
    />
  );
}

/** Pick parameters from the library: checkboxes grouped by category, with a filter. */
export function ParameterPicker({
  label,
  options,
  value,
  onChange,
  exclude,
}: {
  label: string;
  options: ParameterSummary[];
  value: string[];
  onChange: (v: string[]) => void;
  exclude?: string;
}) {
  const [filter, setFilter] = useState('');
  const filterId = useId();
  const byCategory = useMemo(() => {
    const f = filter.trim().toLowerCase();
    const shown = options.filter(
      (o) => o.slug !== exclude && (!f || o.name.toLowerCase().includes(f) || o.slug.includes(f) || o.aliases.some((a) => a.toLowerCase().includes(f))),
    );
    return PARAMETER_CATEGORIES.map((c) => ({ category: c, items: shown.filter((o) => o.category === c) })).filter((g) => g.items.length > 0);
  }, [options, filter, exclude]);
  const toggle = (slug: string, on: boolean) => onChange(on ? [...value, slug] : value.filter((v) => v !== slug));
  const unknown = value.filter((v) => !options.some((o) => o.slug === v));
  return (
    <fieldset className="flex flex-col gap-2 rounded-md border border-ink/20 bg-white/50 p-3">
      <legend className="px-1 text-sm font-medium text-ink">
        {label} <span className="font-normal text-ink-muted">({value.length} chosen)</span>
      </legend>
      <label htmlFor={filterId} className="sr-only">
        Filter the settings
      </label>
      <input
        id={filterId}
        type="search"
        value={filter}
        onChange={(e) => setFilter(e.target.value)}
        placeholder="Filter: brake, timing…"
        className="w-full rounded-md border border-ink/25 bg-white/80 px-3 py-1.5 text-sm sm:w-64"
      />
      <div className="grid max-h-64 gap-3 overflow-y-auto pr-1 sm:grid-cols-2">
        {byCategory.map((g) => (
          <div key={g.category}>
            <p className="mb-1 text-xs font-semibold tracking-wider text-ink-muted uppercase">{g.category}</p>
            <ul className="flex flex-col gap-0.5">
              {g.items.map((o) => (
                <li key={o.slug}>
                  <label className="flex items-center gap-2 text-sm">
                    <input
                      type="checkbox"
                      checked={value.includes(o.slug)}
                      onChange={(e) => toggle(o.slug, e.target.checked)}
                      className="h-4 w-4 accent-copper"
                    />
                    {o.name}
                  </label>
                </li>
              ))}
            </ul>
          </div>
        ))}
        {options.length === 0 && <p className="text-sm text-ink-muted">The parameter library is not available right now; you can add these later.</p>}
      </div>
      {unknown.length > 0 && <p className="text-xs text-caution">Not in the library: {unknown.join(', ')}</p>}
    </fieldset>
  );
}
