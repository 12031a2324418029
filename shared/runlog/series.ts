import { FULL_THROTTLE_PCT, SUSTAINED_FULL_THROTTLE_S, VALUE_CHANNELS, type ValueChannel } from './vocabulary';

/** A chart-ready series: bucket start times (s from the run's start) and per channel each bucket's min and max. */
export type BucketSeries = {
  t: number[];
  channels: Partial<Record<ValueChannel, { min: Array<number | null>; max: Array<number | null> }>>;
};

/**
 * Splits the run into at most `points` equal stretches of time and keeps each channel's minimum and maximum
 * in each, so no peak is lost however far the chart is zoomed out (per-pixel min/max, as in M4, Jugel et
 * al., PVLDB 7(10), 2014). Empty buckets are left out; a bucket with no reading of a channel holds null.
 */
export function bucketMinMax(time: ArrayLike<number>, channels: Partial<Record<ValueChannel, ArrayLike<number>>>, points: number): BucketSeries {
  const n = time.length;
  const names = VALUE_CHANNELS.filter((c) => channels[c]);
  const out: BucketSeries = { t: [], channels: Object.fromEntries(names.map((c) => [c, { min: [], max: [] }])) };
  if (!n) return out;
  const t0 = time[0];
  const span = time[n - 1] - t0;
  const buckets = Math.max(1, Math.min(points, n));
  const width = span > 0 ? span / buckets : 1;
  let i = 0;
  for (let b = 0; b < buckets && i < n; b++) {
    const end = b === buckets - 1 ? Infinity : t0 + (b + 1) * width;
    const start = i;
    while (i < n && time[i] < end) i++;
    if (i === start) continue;
    out.t.push(time[start] - t0);
    for (const c of names) {
      const col = channels[c]!;
      let lo = Infinity;
      let hi = -Infinity;
      for (let k = start; k < i; k++) {
        const v = col[k];
        if (v < lo) lo = v;
        if (v > hi) hi = v;
      }
      out.channels[c]!.min.push(lo === Infinity ? null : lo);
      out.channels[c]!.max.push(hi === -Infinity ? null : hi);
    }
  }
  return out;
}

/**
 * Time (s from the run's start) of the first sustained full throttle: throttle at or above the full-throttle
 * share held for at least {@link SUSTAINED_FULL_THROTTLE_S}; null when the run never holds it.
 */
export function firstSustainedFullThrottle(time: ArrayLike<number>, throttle: ArrayLike<number> | undefined): number | null {
  if (!throttle || !time.length) return null;
  let since: number | null = null;
  for (let i = 0; i < time.length; i++) {
    if (throttle[i] >= FULL_THROTTLE_PCT) {
      if (since === null) since = i;
      if (time[i] - time[since] >= SUSTAINED_FULL_THROTTLE_S) return time[since] - time[0];
    } else since = null;
  }
  return null;
}
