import { useCallback, useMemo, useRef, useState } from 'react';
import type uPlot from 'uplot';
import type { RunSeries } from '@shared/schemas/run';
import { CHANNEL_LABELS, type ValueChannel } from '@shared/runlog/vocabulary';
import { Button } from '@/components/ui/button';
import { formatQuantity, toDisplay, unitOf } from '@shared/units';
import { usePalette, useUnits } from '@/lib/preferences';
import { UPlotChart } from './uplot-chart';

type Panel = { title: string; unit: string; channels: ValueChannel[] };
const PANELS: Panel[] = [
  { title: 'Throttle', unit: '%', channels: ['throttle_pct'] },
  { title: 'Motor speed', unit: 'rpm', channels: ['motor_rpm'] },
  { title: 'Temperatures', unit: '°C', channels: ['motor_temp_c', 'esc_temp_c'] },
  { title: 'Current', unit: 'A', channels: ['current_a'] },
  { title: 'Pack voltage', unit: 'V', channels: ['pack_v'] },
];
/** Each channel's colour: a palette variable (src/styles/index.css), so the charts follow dark mode. */
const COLOUR_VARS = {
  throttle_pct: 'chart-2',
  motor_rpm: 'chart-1',
  motor_temp_c: 'danger',
  esc_temp_c: 'ink-muted',
  current_a: 'chart-3',
  pack_v: 'chart-6',
} as const satisfies Record<ValueChannel, string>;
const PALETTE = [...new Set(Object.values(COLOUR_VARS)), 'ink-faint', 'chart-5', 'ink-soft', 'chart-grid'] as const;
/** Temperature channels convert to °F for someone who reads imperial; the stored samples stay °C. */
const TEMPERATURE: ReadonlySet<ValueChannel> = new Set(['motor_temp_c', 'esc_temp_c']);
/** A hex colour with an alpha byte added (band fills), or the colour itself when it is not #rrggbb. */
const withAlpha = (colour: string, alpha: string) => (/^#[0-9a-f]{6}$/i.test(colour) ? `${colour}${alpha}` : colour);

export type ChartRun = { label: string; series: RunSeries; offsetS?: number };

const fmt = (v: number | null | undefined, digits = 1) =>
  v === null || v === undefined || Number.isNaN(v) ? '–' : v.toLocaleString('en-GB', { maximumFractionDigits: digits });

/**
 * Stacked charts on one time axis: each bucket's high and low drawn as a band (so no peak is lost), one cursor
 * across all panels with the values under it, drag to zoom, buttons to zoom and pan, and on a touch screen
 * pinch to zoom and a sideways swipe to pan (every panel follows). A second run (compare) is drawn in grey,
 * shifted by its offset.
 */
export function RunCharts({ runs, toKmh }: { runs: ChartRun[]; toKmh?: ((rpm: number) => number) | null }) {
  const units = useUnits();
  const palette = usePalette(PALETTE);
  const tempUnit = unitOf('temperature', units);
  const speedUnit = unitOf('speed', units);
  /** A channel's reading as shown: temperatures in the chosen scale, everything else as logged. */
  const shown = useCallback(
    (c: ValueChannel, v: number | null | undefined) => (v === null || v === undefined ? v : TEMPERATURE.has(c) ? toDisplay('temperature', v, units) : v),
    [units],
  );
  const channelUnit = (c: ValueChannel) => (TEMPERATURE.has(c) ? tempUnit : CHANNEL_LABELS[c].unit);
  const charts = useRef<uPlot[]>([]);
  const syncing = useRef(false);
  const [cursor, setCursor] = useState<{ t: number; values: Array<Partial<Record<ValueChannel, [number | null, number | null]>>> } | null>(null);
  const syncKey = useMemo(() => `run-${Math.random().toString(36).slice(2)}`, []);

  // One x axis for all runs: the union of bucket times, each run's values looked up at the nearest bucket.
  const base = useMemo(() => {
    const xs = runs.map((r) => r.series.t.map((t) => t - (r.offsetS ?? 0)));
    const all = Float64Array.from(new Set(xs.flat())).sort();
    const lookups = xs.map((x) => Array.from(all, (t) => nearest(x, t)));
    return { x: Array.from(all), lookups };
  }, [runs]);

  const panels = PANELS.filter((p) => p.channels.some((c) => runs.some((r) => r.series.channels[c]))).map((p) =>
    p.unit === '°C' ? { ...p, unit: tempUnit } : p,
  );
  // The estimated road speed under motor speed: the first run's rpm through the setup's gearing (shared calculator).
  const road = toKmh && runs[0]?.series.channels.motor_rpm ? toKmh : null;
  const span = base.x.length ? [base.x[0], base.x[base.x.length - 1]] : [0, 1];

  const built = useMemo(
    () =>
      panels
        .map((panel) => {
          const series: uPlot.Series[] = [{ label: 'Time (s)' }];
          const data: Array<Array<number | null>> = [base.x];
          const bands: uPlot.Band[] = [];
          runs.forEach((run, k) => {
            for (const c of panel.channels) {
              const ch = run.series.channels[c];
              if (!ch) continue;
              const stroke = k === 0 ? palette[COLOUR_VARS[c]] : palette['ink-faint'];
              const pick = (arr: Array<number | null>) => base.lookups[k].map((i) => (i < 0 ? null : (shown(c, arr[i]) ?? null)));
              data.push(pick(ch.max), pick(ch.min));
              const hi = data.length - 2;
              series.push(
                { label: `${run.label}: ${CHANNEL_LABELS[c].label} high`, stroke, width: 1.25, spanGaps: true },
                { label: `${run.label}: ${CHANNEL_LABELS[c].label} low`, stroke, width: 1, spanGaps: true },
              );
              bands.push({ series: [hi, hi + 1], fill: withAlpha(stroke, '33') });
            }
          });
          return { panel, data: data as uPlot.AlignedData, series, bands };
        })
        .concat(
          road
            ? (() => {
                const rpm = runs[0].series.channels.motor_rpm!;
                const pick = (arr: Array<number | null>) =>
                  base.lookups[0].map((i) => (i < 0 || arr[i] === null ? null : toDisplay('speed', road(arr[i]!), units)));
                const stroke = palette['chart-5'];
                return [
                  {
                    panel: { title: 'Road speed, estimated from gearing', unit: speedUnit, channels: [] as ValueChannel[] },
                    data: [base.x, pick(rpm.max), pick(rpm.min)] as uPlot.AlignedData,
                    series: [
                      { label: 'Time (s)' },
                      { label: 'Road speed high', stroke, width: 1.25, spanGaps: true, dash: [6, 3] },
                      { label: 'Road speed low', stroke, width: 1, spanGaps: true, dash: [6, 3] },
                    ] as uPlot.Series[],
                    bands: [{ series: [1, 2], fill: withAlpha(stroke, '22') }] as uPlot.Band[],
                  },
                ];
              })()
            : [],
        ),
    // eslint-disable-next-line react-hooks/exhaustive-deps -- panels derive from runs
    [runs, base, road, palette, units, shown],
  );

  // The whole run's span, read through a ref so the touch handlers attached at creation always see the current one.
  const spanRef = useRef(span);
  spanRef.current = span;

  const register = useCallback(
    (u: uPlot) => {
      charts.current.push(u);
      const detach = attachTouch(
        u,
        (min, max) => setXRef.current(min, max),
        () => spanRef.current,
      );
      return () => {
        detach();
        charts.current = charts.current.filter((c) => c !== u);
      };
    },
    [charts],
  );

  const setX = (min: number, max: number) => {
    syncing.current = true;
    for (const c of charts.current) c.setScale('x', { min, max });
    syncing.current = false;
  };
  const setXRef = useRef(setX);
  setXRef.current = setX;
  const view = () => {
    const s = charts.current[0]?.scales.x;
    return s && s.min !== undefined && s.max !== undefined ? [s.min, s.max] : span;
  };
  const zoom = (f: number) => {
    const [a, b] = view();
    const mid = (a + b) / 2;
    const half = Math.max(0.25, ((b - a) * f) / 2);
    setX(Math.max(span[0], mid - half), Math.min(span[1], mid + half));
  };
  const pan = (f: number) => {
    const [a, b] = view();
    const w = b - a;
    const shift = Math.max(span[0] - a, Math.min(span[1] - b, w * f));
    setX(a + shift, b + shift);
  };

  const options = useMemo(
    () =>
      built.map(({ panel, series, bands }) => {
        const opts: Omit<uPlot.Options, 'width'> = {
          height: 130,
          series,
          bands,
          legend: { show: false },
          scales: { x: { time: false } },
          axes: [
            { stroke: palette['ink-soft'], grid: { stroke: palette['chart-grid'] }, size: 28, values: (_u, v) => v.map((s) => `${s}s`) },
            {
              stroke: palette['ink-soft'],
              grid: { stroke: palette['chart-grid'] },
              size: 52,
              values: (_u, v) => v.map((n) => (Math.abs(n) >= 10_000 ? `${n / 1000}k` : String(n))),
              label: `${panel.title} (${panel.unit})`,
              labelSize: 14,
              labelFont: '11px Inter, sans-serif',
              font: '11px Inter, sans-serif',
            },
          ],
          cursor: { sync: { key: syncKey }, drag: { x: true, y: false } },
          hooks: {
            setScale: [
              (u, key) => {
                if (key !== 'x') return;
                const { min, max } = u.scales.x;
                if (min === undefined || max === undefined) return;
                // The stretch in view, on the chart's element: lets a test (or a person's dev tools) see that every panel agrees.
                u.root.dataset.view = `${min.toFixed(3)}–${max.toFixed(3)}`;
                if (syncing.current) return;
                syncing.current = true;
                for (const c of charts.current) if (c !== u) c.setScale('x', { min, max });
                syncing.current = false;
              },
            ],
            setCursor: [
              (u) => {
                const idx = u.cursor.idx;
                if (idx === null || idx === undefined) return;
                const t = base.x[idx];
                setCursor({
                  t,
                  values: runs.map((run, k) => {
                    const i = base.lookups[k][idx];
                    const out: Partial<Record<ValueChannel, [number | null, number | null]>> = {};
                    if (i < 0) return out;
                    for (const [c, mm] of Object.entries(run.series.channels) as Array<
                      [ValueChannel, { min: Array<number | null>; max: Array<number | null> }]
                    >)
                      out[c] = [mm.min[i], mm.max[i]];
                    return out;
                  }),
                });
              },
            ],
          },
        };
        return opts;
      }),
    [built, syncKey, base, runs, palette],
  );

  return (
    <div className="flex flex-col gap-2" data-testid="run-charts">
      <div className="flex flex-wrap items-center gap-2">
        <Button size="sm" variant="secondary" type="button" onClick={() => zoom(0.5)}>
          Zoom in
        </Button>
        <Button size="sm" variant="secondary" type="button" onClick={() => zoom(2)}>
          Zoom out
        </Button>
        <Button size="sm" variant="secondary" type="button" onClick={() => pan(-0.5)} aria-label="Pan earlier">
          ◀
        </Button>
        <Button size="sm" variant="secondary" type="button" onClick={() => pan(0.5)} aria-label="Pan later">
          ▶
        </Button>
        <Button size="sm" variant="ghost" type="button" onClick={() => setX(span[0], span[1])}>
          Reset zoom
        </Button>
        <span className="text-xs text-ink-muted">Drag across a chart to zoom to that stretch; on a touch screen, pinch to zoom and swipe sideways to pan.</span>
      </div>
      <div
        className="sticky top-0 z-10 rounded-md border border-ink/15 bg-paper-card px-3 py-2 text-xs tabular-nums"
        aria-live="polite"
        data-testid="cursor-readout"
      >
        {cursor ? (
          <div className="flex flex-col gap-1">
            <span className="font-medium">at {fmt(cursor.t, 2)} s</span>
            {cursor.values.map((vals, k) => (
              <span key={k} className="flex flex-wrap gap-x-3">
                {runs.length > 1 && <span className="font-medium">{runs[k].label}:</span>}
                {(Object.keys(vals) as ValueChannel[]).map((c) => (
                  <span key={c}>
                    {CHANNEL_LABELS[c].label}{' '}
                    {vals[c]![0] === vals[c]![1] ? fmt(shown(c, vals[c]![1])) : `${fmt(shown(c, vals[c]![0]))}–${fmt(shown(c, vals[c]![1]))}`} {channelUnit(c)}
                    {c === 'motor_rpm' && road && k === 0 && vals[c]![1] !== null ? ` (≈ ${formatQuantity('speed', road(vals[c]![1]!), units)})` : ''}
                  </span>
                ))}
              </span>
            ))}
          </div>
        ) : (
          'Move over a chart (or touch it) to read the values at that moment.'
        )}
      </div>
      {built.map(({ panel, data }, i) => (
        <figure key={panel.title} className="m-0" data-testid={panel.channels.length ? undefined : 'road-speed-chart'}>
          <figcaption className="text-xs font-medium text-ink-muted">
            {panel.title} ({panel.unit})
          </figcaption>
          <UPlotChart options={options[i]} data={data} onCreate={register} />
        </figure>
      ))}
    </div>
  );
}

/** The narrowest stretch of time a pinch may zoom to, in seconds. */
const MIN_SPAN_S = 0.25;

/** Clamps a view [min, max] inside the run's span, keeping its width (or the whole span when wider). */
function clampView(min: number, max: number, span: number[]): [number, number] {
  const full = span[1] - span[0];
  let w = Math.max(Math.min(max - min, full), Math.min(MIN_SPAN_S, full));
  if (!(w > 0)) w = full;
  let lo = min + (max - min - w) / 2;
  lo = Math.max(span[0], Math.min(span[1] - w, lo));
  return [lo, lo + w];
}

/**
 * Touch on a chart: two fingers pinch-zoom the time axis, keeping the moments under the fingers under them;
 * one finger swiped sideways pans. A vertical swipe is left to the page (CSS touch-action: pan-y), so the page
 * still scrolls past the charts. `setX` moves every panel together.
 */
function attachTouch(u: uPlot, setX: (min: number, max: number) => void, span: () => number[]) {
  const el = u.over;
  el.style.touchAction = 'pan-y';
  type Start = { min: number; max: number; xs: number[]; vals: number[]; mode: 'pending' | 'pan' | 'pinch' | 'scroll'; y0: number };
  let start: Start | null = null;
  const px = (t: Touch) => t.clientX - el.getBoundingClientRect().left;
  const begin = (e: TouchEvent) => {
    const { min, max } = u.scales.x;
    if (min === undefined || max === undefined) return;
    const xs = Array.from(e.touches, px);
    start = { min, max, xs, vals: xs.map((x) => u.posToVal(x, 'x')), mode: e.touches.length >= 2 ? 'pinch' : 'pending', y0: e.touches[0].clientY };
  };
  const onStart = (e: TouchEvent) => {
    if (e.touches.length <= 2) begin(e);
  };
  const onMove = (e: TouchEvent) => {
    if (!start) return;
    const width = u.over.clientWidth || 1;
    if (start.mode === 'pinch' && e.touches.length >= 2) {
      e.preventDefault();
      const [q1, q2] = [px(e.touches[0]), px(e.touches[1])];
      if (Math.abs(q2 - q1) < 10 || Math.abs(start.xs[1] - start.xs[0]) < 10) return;
      const slope = (start.vals[1] - start.vals[0]) / (q2 - q1);
      if (!(slope > 0)) return;
      const lo = start.vals[0] - q1 * slope;
      setX(...clampView(lo, lo + width * slope, span()));
      return;
    }
    if (e.touches.length !== 1) return;
    const dx = px(e.touches[0]) - start.xs[0];
    const dy = e.touches[0].clientY - start.y0;
    if (start.mode === 'pending' && Math.hypot(dx, dy) > 8) start.mode = Math.abs(dx) > Math.abs(dy) ? 'pan' : 'scroll';
    if (start.mode !== 'pan') return;
    e.preventDefault();
    const shift = (-dx * (start.max - start.min)) / width;
    setX(...clampView(start.min + shift, start.max + shift, span()));
  };
  const onEnd = (e: TouchEvent) => {
    // Lifting one finger of a pinch continues as a pan from where the view is now.
    if (e.touches.length === 1 && start?.mode === 'pinch') {
      begin(e);
      if (start) start.mode = 'pan';
    } else if (!e.touches.length) start = null;
  };
  el.addEventListener('touchstart', onStart, { passive: true });
  el.addEventListener('touchmove', onMove, { passive: false });
  el.addEventListener('touchend', onEnd);
  el.addEventListener('touchcancel', onEnd);
  return () => {
    el.removeEventListener('touchstart', onStart);
    el.removeEventListener('touchmove', onMove);
    el.removeEventListener('touchend', onEnd);
    el.removeEventListener('touchcancel', onEnd);
  };
}

/** Index of the bucket time in a sorted list equal to t (within a millisecond), or -1. */
function nearest(xs: number[], t: number): number {
  let lo = 0;
  let hi = xs.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    if (Math.abs(xs[mid] - t) < 1e-6) return mid;
    if (xs[mid] < t) lo = mid + 1;
    else hi = mid - 1;
  }
  return -1;
}
