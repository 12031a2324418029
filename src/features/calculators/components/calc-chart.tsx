import { Bar, BarChart, CartesianGrid, Cell, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { CalculatorName } from '@shared/calc/registry';
import { useMemo } from 'react';
import { toDisplay, unitOf, type UnitSystem } from '@shared/units';
import { usePalette } from '@/lib/preferences';

// Colours from the notebook palette's variables (src/styles/index.css) as literal values, read again when
// the palette changes (dark mode).
const PALETTE = ['chart-1', 'chart-2', 'ink-faint', 'paper-line', 'copper-light', 'ink-soft', 'ink', 'paper-card'] as const;
type Colours = ReturnType<typeof colours>;
function colours(p: Record<(typeof PALETTE)[number], string>) {
  return {
    COPPER: p['chart-1'],
    INK: p['chart-2'],
    INK_FAINT: p['ink-faint'],
    GRID: p['paper-line'],
    BAR: p['copper-light'],
    AXIS: { fontSize: 12, fill: p['ink-soft'] },
    TOOLTIP: {
      contentStyle: { background: p['paper-card'], borderColor: p['paper-line'], color: p.ink },
      labelStyle: { color: p.ink },
      itemStyle: { color: p.ink },
    },
  };
}

type Props = { name: CalculatorName; results: Record<string, unknown>; inputs: Record<string, string>; units?: UnitSystem };
type ChartProps = Omit<Props, 'name'> & { c: Colours };

/** An HTML legend: it wraps on a phone, where recharts' SVG legend would run into the plot. */
function ChartKey({ items }: { items: { label: string; color: string; dashed?: boolean }[] }) {
  return (
    <ul className="mb-1 flex list-none flex-wrap gap-x-4 gap-y-1 p-0 font-sans text-xs text-ink-soft">
      {items.map((it) => (
        <li key={it.label} className="flex items-center gap-1.5">
          <svg width="22" height="8" aria-hidden>
            <line x1="0" y1="4" x2="22" y2="4" stroke={it.color} strokeWidth="2.5" strokeDasharray={it.dashed ? '5 3' : undefined} />
          </svg>
          {it.label}
        </li>
      ))}
    </ul>
  );
}

const rpmTick = (v: number) => (v >= 1000 ? `${(v / 1000).toLocaleString('en-GB', { maximumFractionDigits: 1 })}k` : String(v));

/** Round-number ticks from 0 to `end` (at most about seven), so the axis reads 0, 5k, 10k … */
function niceTicks(end: number): number[] {
  const steps = [500, 1000, 2000, 2500, 5000, 10_000, 20_000, 25_000, 50_000];
  const step = steps.find((s) => end / s <= 7) ?? 100_000;
  const ticks: number[] = [];
  for (let v = 0; v <= end + 1e-9; v += step) ticks.push(v);
  return ticks;
}
const atNumber = (s: string | undefined) => (s !== undefined && s.trim() !== '' && Number.isFinite(Number(s)) ? Number(s) : undefined);

function TimingChart({ results, inputs, c }: ChartProps) {
  const { COPPER, INK, INK_FAINT, GRID, AXIS, TOOLTIP } = c;
  const points = results.points as { rpm: number; deg: number; fullThrottleDeg?: number }[];
  const hasStep = points.some((p) => p.fullThrottleDeg !== undefined);
  const at = atNumber(inputs.atRpm);
  const end = points.at(-1)?.rpm ?? 0;
  // Whole 5°/10° steps read better than recharts' own 9°, 18°, 27°.
  const top = Math.max(...points.map((p) => p.fullThrottleDeg ?? p.deg));
  const degStep = [5, 10, 15, 20].find((st) => top / st <= 6) ?? 30;
  const degTicks = Array.from({ length: Math.max(1, Math.ceil(top / degStep)) + 1 }, (_, i) => i * degStep);
  return (
    <>
      {hasStep && (
        <ChartKey
          items={[
            { label: 'Throttle below full', color: COPPER },
            { label: 'Full throttle, after the delay', color: INK, dashed: true },
          ]}
        />
      )}
      <ResponsiveContainer width="100%" height={260}>
        <LineChart data={points} margin={{ top: 12, right: 16, bottom: 22, left: 4 }}>
          <CartesianGrid stroke={GRID} strokeDasharray="3 3" />
          <XAxis
            dataKey="rpm"
            type="number"
            domain={[0, end]}
            ticks={niceTicks(end)}
            tickFormatter={rpmTick}
            tick={AXIS}
            label={{ value: 'Motor speed (rpm)', position: 'insideBottom', offset: -12, ...AXIS }}
          />
          <YAxis
            tick={AXIS}
            width={44}
            domain={[0, degTicks.at(-1) ?? 0]}
            ticks={degTicks}
            label={{ value: 'Timing (°)', angle: -90, position: 'insideLeft', offset: 10, ...AXIS }}
          />
          <Tooltip
            {...TOOLTIP}
            formatter={(v) => `${Number(v).toLocaleString('en-GB', { maximumFractionDigits: 1 })}°`}
            labelFormatter={(l) => `${Number(l).toLocaleString('en-GB')} rpm`}
          />
          {at !== undefined && (
            <ReferenceLine x={at} stroke={INK_FAINT} strokeDasharray="4 3" label={{ value: `${rpmTick(at)} rpm`, position: 'insideTopLeft', ...AXIS }} />
          )}
          <Line type="linear" dataKey="deg" name="Throttle below full" stroke={COPPER} strokeWidth={2.5} dot={false} isAnimationActive={false} />
          {hasStep && (
            <Line
              type="linear"
              dataKey="fullThrottleDeg"
              name="Full throttle, after the delay"
              stroke={INK}
              strokeWidth={2}
              strokeDasharray="6 4"
              dot={false}
              isAnimationActive={false}
            />
          )}
        </LineChart>
      </ResponsiveContainer>
    </>
  );
}

function ThrottleChart({ results, inputs, c }: ChartProps) {
  const { COPPER, INK_FAINT, GRID, AXIS, TOOLTIP } = c;
  const points = (results.points as { inputPct: number; outputPct: number }[]).map((p) => ({ ...p, linear: p.inputPct }));
  const at = atNumber(inputs.inputPct);
  return (
    <>
      <ChartKey
        items={[
          { label: 'Your curve', color: COPPER },
          { label: 'Linear', color: INK_FAINT, dashed: true },
        ]}
      />
      <ResponsiveContainer width="100%" height={260}>
        <LineChart data={points} margin={{ top: 12, right: 16, bottom: 22, left: 4 }}>
          <CartesianGrid stroke={GRID} strokeDasharray="3 3" />
          <XAxis
            dataKey="inputPct"
            type="number"
            domain={[0, 100]}
            ticks={[0, 25, 50, 75, 100]}
            tick={AXIS}
            label={{ value: 'Stick travel (%)', position: 'insideBottom', offset: -12, ...AXIS }}
          />
          <YAxis
            domain={[0, 100]}
            ticks={[0, 25, 50, 75, 100]}
            tick={AXIS}
            width={44}
            label={{ value: 'Output (%)', angle: -90, position: 'insideLeft', offset: 10, ...AXIS }}
          />
          <Tooltip
            {...TOOLTIP}
            formatter={(v) => `${Number(v).toLocaleString('en-GB', { maximumFractionDigits: 1 })} %`}
            labelFormatter={(l) => `${l} % stick`}
          />
          {at !== undefined && <ReferenceLine x={at} stroke={INK_FAINT} strokeDasharray="4 3" />}
          <Line type="linear" dataKey="linear" name="Linear" stroke={INK_FAINT} strokeDasharray="4 4" dot={false} isAnimationActive={false} />
          <Line type="monotone" dataKey="outputPct" name="Your curve" stroke={COPPER} strokeWidth={2.5} dot={false} isAnimationActive={false} />
        </LineChart>
      </ResponsiveContainer>
    </>
  );
}

function GearingChart({ results, inputs, units = 'metric', c }: ChartProps) {
  const { COPPER, GRID, BAR, AXIS, TOOLTIP } = c;
  const sweep = (results.pinionSweep as { pinion: number; finalDriveRatio: number; rolloutMm: number }[]).map((p) => ({
    ...p,
    rollout: toDisplay('rollout', p.rolloutMm, units),
  }));
  const unit = unitOf('rollout', units);
  const current = atNumber(inputs.pinion);
  return (
    <ResponsiveContainer width="100%" height={260}>
      <BarChart data={sweep} margin={{ top: 12, right: 16, bottom: 22, left: 4 }}>
        <CartesianGrid stroke={GRID} strokeDasharray="3 3" vertical={false} />
        <XAxis dataKey="pinion" tick={AXIS} label={{ value: 'Pinion (teeth)', position: 'insideBottom', offset: -12, ...AXIS }} />
        <YAxis tick={AXIS} width={44} label={{ value: `Rollout (${unit})`, angle: -90, position: 'insideLeft', offset: 10, ...AXIS }} />
        <Tooltip
          {...TOOLTIP}
          formatter={(v, _n, item) => [
            `${Number(v).toLocaleString('en-GB', { maximumFractionDigits: units === 'imperial' ? 3 : 1 })} ${unit} (FDR ${(item.payload as { finalDriveRatio: number }).finalDriveRatio.toFixed(2)}:1)`,
            'Rollout',
          ]}
          labelFormatter={(l) => `${l}-tooth pinion`}
        />
        <Bar dataKey="rollout" name="Rollout" isAnimationActive={false}>
          {sweep.map((p) => (
            <Cell key={p.pinion} fill={p.pinion === current ? COPPER : BAR} fillOpacity={p.pinion === current ? 1 : 0.55} />
          ))}
        </Bar>
      </BarChart>
    </ResponsiveContainer>
  );
}

const CAPTIONS: Partial<Record<CalculatorName, string>> = {
  'timing-curve': 'Timing against motor speed',
  throttle: 'Output against stick travel',
  gearing: 'Rollout for nearby pinions (yours highlighted)',
};

/** The chart for a calculator's results; loaded on demand (recharts is large). */
export default function CalcChart({ name, results, inputs, units }: Props) {
  const palette = usePalette(PALETTE);
  const c = useMemo(() => colours(palette), [palette]);
  const caption = CAPTIONS[name];
  if (!caption) return null;
  return (
    <figure className="m-0" data-chart={name}>
      <figcaption className="mb-1 font-sans text-xs font-semibold tracking-wider text-ink-muted uppercase">{caption}</figcaption>
      {name === 'timing-curve' && <TimingChart results={results} inputs={inputs} c={c} />}
      {name === 'throttle' && <ThrottleChart results={results} inputs={inputs} c={c} />}
      {name === 'gearing' && <GearingChart results={results} inputs={inputs} units={units} c={c} />}
    </figure>
  );
}
