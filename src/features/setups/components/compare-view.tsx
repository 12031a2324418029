import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { SETUP_SECTIONS } from '@shared/setup/fields';
import type { SetupDelta } from '@shared/setup/compare';
import { formatFixed, formatRatio, toDisplay, unitOf, type Quantity, type UnitSystem } from '@shared/units';
import { useUnits } from '@/lib/preferences';
import { Card, Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { TableScroll } from '@/components/ui/table-scroll';
import { setupQueries } from '../api/setups';
import { CautionList } from './caution-list';
import { showValue } from './labels';

function SetupPicker({ label, name, value, onChange }: { label: string; name: string; value: string; onChange: (v: string) => void }) {
  const library = useQuery(setupQueries.library());
  return (
    <label className="flex min-w-0 flex-1 flex-col text-sm font-medium">
      {label}
      <select
        name={name}
        value={value}
        onChange={(e) => onChange(e.target.value)}
        className="mt-1 w-full rounded-md border border-ink/25 bg-white/80 px-2 py-1.5 font-normal"
      >
        <option value="">Choose a setup…</option>
        <optgroup label="Published baselines">
          {library.data?.baselines.map((b) => (
            <option key={b.guideSlug} value={`guide:${b.guideSlug}`}>
              {b.guideTitle} (v{b.revisionNumber})
            </option>
          ))}
        </optgroup>
        {!!library.data?.uploads.length && (
          <optgroup label="Your uploads">
            {library.data.uploads.map((u) => (
              <option key={u.id} value={u.id}>
                {u.originalName} — {new Date(u.createdAt).toLocaleDateString('en-GB')}
              </option>
            ))}
          </optgroup>
        )}
      </select>
    </label>
  );
}

/** How each computed value reads: a fixed number of decimals per unit, so a column lines up (#17). */
const SHOWN: Record<string, { digits: number; quantity?: Quantity; suffix?: string }> = {
  ':1': { digits: 2 },
  mm: { digits: 2, quantity: 'rollout' },
  'km/h': { digits: 1, quantity: 'speed' },
  rpm: { digits: 0, suffix: ' rpm' },
  deg: { digits: 1, suffix: '°' },
  V: { digits: 2, suffix: ' V' },
};
function shownAs(unit: string, units: UnitSystem) {
  const s = SHOWN[unit] ?? { digits: 2, suffix: unit ? ` ${unit}` : '' };
  if (!s.quantity) return { digits: s.digits, suffix: s.suffix ?? '', convert: (v: number) => v };
  // Lengths and speeds convert linearly, so a difference converts like a value.
  const q = s.quantity;
  return { digits: units === 'imperial' && q === 'rollout' ? 3 : s.digits, suffix: ` ${unitOf(q, units)}`, convert: (v: number) => toDisplay(q, v, units) };
}
function deltaText(d: SetupDelta, units: UnitSystem) {
  if (d.delta === null) return '—';
  if (d.delta === 0) return 'no change';
  const s = shownAs(d.unit, units);
  return `${d.delta > 0 ? '+' : '−'}${formatFixed(Math.abs(s.convert(d.delta)), s.digits)}${d.unit === ':1' ? '' : s.suffix}`;
}
function valueText(v: number | null, unit: string, units: UnitSystem) {
  if (v === null) return '—';
  if (unit === ':1') return formatRatio(v);
  const s = shownAs(unit, units);
  return `${formatFixed(s.convert(v), s.digits)}${s.suffix}`;
}

/** The rpm the timing is read at: a draft while typing, committed to the URL on Enter or leaving the field. */
function RpmField({ rpm, onCommit }: { rpm: number | undefined; onCommit: (value: string) => void }) {
  const shown = String(rpm ?? 20000);
  const [draft, setDraft] = useState(shown);
  // Leaving the field untouched changes nothing (no rpm added to the address, no new comparison).
  const commit = () => draft !== shown && onCommit(draft);
  return (
    <label className="flex flex-col text-sm font-medium sm:w-40">
      Timing read at
      <span className="mt-1 flex items-center gap-1">
        <input
          type="number"
          name="rpm"
          min={1000}
          max={150000}
          step={1000}
          value={draft}
          onChange={(e) => setDraft(e.target.value)}
          onBlur={commit}
          onKeyDown={(e) => e.key === 'Enter' && commit()}
          className="w-full rounded-md border border-ink/25 bg-white/80 px-2 py-1.5 font-normal tabular-nums"
        />
        <span className="font-normal text-ink-muted">rpm</span>
      </span>
    </label>
  );
}

/**
 * The comparison page body: pick two setups, then see every field side by side, the computed deltas and
 * the cautions. Everything it shows comes from the URL (a, b, rpm, only=changed), so a link, a reload
 * and the browser's back and forward buttons all show the comparison the address names; each new pair
 * is its own history entry, while the rpm and the filter refine the entry they are on.
 */
export function CompareView() {
  const [params, setParams] = useSearchParams();
  const a = params.get('a') ?? '';
  const b = params.get('b') ?? '';
  const rpmParam = Number(params.get('rpm'));
  const rpm = Number.isFinite(rpmParam) && rpmParam > 0 ? rpmParam : undefined;
  const onlyChanged = params.get('only') === 'changed';
  const set = (key: 'a' | 'b' | 'rpm' | 'only', value: string) => {
    if ((params.get(key) ?? '') === value) return;
    setParams(
      (current) => {
        const next = new URLSearchParams(current);
        if (value) next.set(key, value);
        else next.delete(key);
        return next;
      },
      // The checkbox is controlled by the address: update it in the same frame as the click, not a tick later.
      { replace: key === 'rpm' || key === 'only', flushSync: key === 'only' },
    );
  };
  const cmp = useQuery({ ...setupQueries.compare(a, b, rpm), enabled: !!a && !!b });
  const units = useUnits();
  const labels = cmp.data ? { a: `A: ${cmp.data.a.label}`, b: `B: ${cmp.data.b.label}` } : { a: 'A', b: 'B' };
  // Column heads stay short (A, B) so the tables fit a phone; the legend names them.
  const legend = cmp.data && (
    <p className="text-sm text-ink-soft">
      <strong>A</strong> = {cmp.data.a.label} · <strong>B</strong> = {cmp.data.b.label}
    </p>
  );

  return (
    <div className="flex flex-col gap-6">
      <Card className="flex flex-col gap-3 p-4 sm:flex-row sm:items-end">
        <SetupPicker label="A (for instance a guide's baseline)" name="a" value={a} onChange={(v) => set('a', v)} />
        <SetupPicker label="B (for instance your own setup)" name="b" value={b} onChange={(v) => set('b', v)} />
        {/* Keyed by the URL's rpm: back, forward or a new link starts the field from the address again. */}
        <RpmField key={rpm ?? 'default'} rpm={rpm} onCommit={(v) => set('rpm', v)} />
      </Card>

      {(!a || !b) && <p className="text-ink-soft">Choose two setups to compare: a published baseline and one of your uploads, or any two.</p>}
      {cmp.isFetching && !cmp.data && <Spinner label="Comparing…" />}
      {cmp.error && (
        <Notice tone="danger" title="These setups cannot be compared">
          {cmp.error.message}
        </Notice>
      )}
      {cmp.data && (
        <>
          {legend}
          <CautionList cautions={cmp.data.cautions} sideLabels={labels} />
          {cmp.data.cautions.length === 0 && <Notice tone="ok">No value of either setup leaves its safe window.</Notice>}

          <section aria-labelledby="deltas-title">
            <h2 id="deltas-title" className="mb-2 text-lg font-semibold">
              Computed differences
            </h2>
            <TableScroll label="Computed differences" className="rounded-lg border border-paper-line bg-paper-card">
              <table className="w-full text-sm" data-testid="deltas-table">
                <thead>
                  <tr className="border-b-2 border-ink/20 bg-paper-deep text-left">
                    <th scope="col" className="px-3 py-2">
                      Value
                    </th>
                    <th scope="col" className="px-3 py-2">
                      A
                    </th>
                    <th scope="col" className="px-3 py-2">
                      B
                    </th>
                    <th scope="col" className="px-3 py-2">
                      Change A → B
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {cmp.data.deltas.map((d) => (
                    <tr key={d.key} className={`border-b border-paper-line ${d.delta ? 'bg-copper-wash/60' : ''}`}>
                      <th scope="row" className="px-3 py-2 text-left font-medium">
                        {d.label}
                      </th>
                      <td className="px-3 py-2 text-right tabular-nums">{valueText(d.a, d.unit, units)}</td>
                      <td className="px-3 py-2 text-right tabular-nums">{valueText(d.b, d.unit, units)}</td>
                      <td className="px-3 py-2 text-right font-semibold tabular-nums">{deltaText(d, units)}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </TableScroll>
            <p className="mt-1 text-xs text-ink-muted">
              Speeds at each pack's nominal voltage, with the motor reaching {Math.round((cmp.data.computed.a.speed?.loadFactor ?? 0.85) * 100)} % of its
              no-load rpm. Estimates, not measurements.
            </p>
          </section>

          <section aria-labelledby="fields-title">
            <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
              <h2 id="fields-title" className="text-lg font-semibold">
                Every field ({cmp.data.differences.length} {cmp.data.differences.length === 1 ? 'difference' : 'differences'})
              </h2>
              <label className="flex items-center gap-2 text-sm">
                <input type="checkbox" checked={onlyChanged} onChange={(e) => set('only', e.target.checked ? 'changed' : '')} /> Show only differences
              </label>
            </div>
            <TableScroll label="Every field" className="rounded-lg border border-paper-line bg-paper-card">
              <table className="w-full text-sm" data-testid="fields-table">
                <thead>
                  <tr className="border-b-2 border-ink/20 bg-paper-deep text-left">
                    <th scope="col" className="w-1/3 min-w-32 px-3 py-2">
                      Field
                    </th>
                    <th scope="col" className="px-3 py-2">
                      A
                    </th>
                    <th scope="col" className="px-3 py-2">
                      B
                    </th>
                  </tr>
                </thead>
                {SETUP_SECTIONS.map((section) => {
                  const rows = cmp.data.fields.filter((f) => f.section === section.key && (!onlyChanged || f.changed));
                  if (!rows.length) return null;
                  return (
                    <tbody key={section.key}>
                      <tr>
                        <th colSpan={3} scope="colgroup" className="bg-paper-deep/60 px-3 py-1 text-left text-xs tracking-wide text-ink-muted uppercase">
                          {section.title}
                        </th>
                      </tr>
                      {rows.map((f) => (
                        <tr
                          key={f.path}
                          className={`border-b border-paper-line ${f.changed ? 'bg-copper-wash font-medium' : ''}`}
                          data-changed={f.changed || undefined}
                        >
                          <th scope="row" className="px-3 py-1.5 text-left font-normal">
                            {f.changed && (
                              <span className="mr-1 text-copper-dark" aria-label="changed">
                                ●
                              </span>
                            )}
                            {f.label}
                          </th>
                          <td className="px-3 py-1.5 tabular-nums">{showValue(f.path, f.a, f.unit, units)}</td>
                          <td className="px-3 py-1.5 tabular-nums">{showValue(f.path, f.b, f.unit, units)}</td>
                        </tr>
                      ))}
                    </tbody>
                  );
                })}
              </table>
            </TableScroll>
          </section>
        </>
      )}
    </div>
  );
}
