/**
 * Aligning two runs by the shape of a trace: the lag at which run b's throttle (or motor speed) best matches
 * run a's, found by normalised cross-correlation (the Pearson correlation of the overlapping stretch at each
 * lag). Both traces are first put on one even time grid by linear interpolation, since the two runs may be
 * sampled at different rates. Pure functions, used by the server's compare and tested against a brute-force
 * Pearson correlation computed independently.
 */

/** The shortest overlap, as a share of the shorter trace, a lag may leave; shorter overlaps match by chance. */
export const MIN_OVERLAP_SHARE = 0.5;
/** Below this correlation the best lag is not trusted and the caller falls back to another method. */
export const MIN_CORRELATION = 0.5;
/** The grid is at most this many points per run, so the search stays a few tens of milliseconds on 60,000-row runs. */
export const MAX_GRID_POINTS = 4000;

/**
 * The lag (in samples) that best lines `b` up on `a`: the k maximising the Pearson correlation of a[i] with
 * b[i + k] over the indices where both exist, among lags leaving at least `minOverlap` pairs. A positive k
 * means the same moment comes k samples later in b. Null when no lag leaves a long enough overlap with
 * variation on both sides.
 */
export function bestLag(a: ArrayLike<number>, b: ArrayLike<number>, minOverlap: number): { lag: number; correlation: number } | null {
  const na = a.length;
  const nb = b.length;
  let best: { lag: number; correlation: number } | null = null;
  // Prefix sums make each lag's means and variances O(1); the cross term is the O(overlap) part.
  const pa = prefix(a);
  const pa2 = prefix(a, true);
  const pb = prefix(b);
  const pb2 = prefix(b, true);
  for (let k = -(na - 1); k <= nb - 1; k++) {
    const i0 = Math.max(0, -k);
    const i1 = Math.min(na, nb - k); // exclusive
    const n = i1 - i0;
    if (n < minOverlap || n < 2) continue;
    const sa = pa[i1] - pa[i0];
    const sb = pb[i1 + k] - pb[i0 + k];
    const varA = pa2[i1] - pa2[i0] - (sa * sa) / n;
    const varB = pb2[i1 + k] - pb2[i0 + k] - (sb * sb) / n;
    if (varA <= 1e-9 * n || varB <= 1e-9 * n) continue;
    let sab = 0;
    for (let i = i0; i < i1; i++) sab += a[i] * b[i + k];
    const r = (sab - (sa * sb) / n) / Math.sqrt(varA * varB);
    if (!best || r > best.correlation + 1e-12 || (Math.abs(r - best.correlation) <= 1e-12 && Math.abs(k) < Math.abs(best.lag)))
      best = { lag: k, correlation: r };
  }
  return best;
}

function prefix(x: ArrayLike<number>, squared = false): Float64Array {
  const out = new Float64Array(x.length + 1);
  for (let i = 0; i < x.length; i++) out[i + 1] = out[i] + (squared ? x[i] * x[i] : x[i]);
  return out;
}

/** Linear interpolation of (time, value) onto an even grid from the trace's first time, `step` seconds apart. */
export function resample(time: ArrayLike<number>, values: ArrayLike<number>, step: number): Float64Array {
  const n = time.length;
  if (!n) return new Float64Array(0);
  const t0 = time[0];
  const count = Math.floor((time[n - 1] - t0) / step) + 1;
  const out = new Float64Array(count);
  let j = 0;
  for (let g = 0; g < count; g++) {
    const t = t0 + g * step;
    while (j < n - 2 && time[j + 1] < t) j++;
    const ta = time[j];
    const tb = time[Math.min(j + 1, n - 1)];
    const va = values[j];
    const vb = values[Math.min(j + 1, n - 1)];
    out[g] = tb > ta ? va + ((vb - va) * (t - ta)) / (tb - ta) : va;
  }
  return out;
}

export type Trace = { time: ArrayLike<number>; values: ArrayLike<number> };

/** The trace without its empty cells (NaN); the grid interpolates across them, keeping the run's start as time zero. */
function withoutEmpty(x: Trace): Trace {
  const time: number[] = [];
  const values: number[] = [];
  for (let i = 0; i < x.time.length; i++)
    if (Number.isFinite(x.values[i])) {
      time.push(x.time[i]);
      values.push(x.values[i]);
    }
  // Keep the start: a run whose first cells are empty still counts its time from its first row.
  if (time.length && x.time.length && time[0] !== x.time[0]) {
    time.unshift(x.time[0]);
    values.unshift(values[0]);
  }
  return { time, values };
}

/**
 * The offset in seconds that lines b up on a (b's time minus a's time of the same moment, both from each run's
 * start), found by cross-correlating the two traces on a common grid, with the correlation reached; null when
 * the traces are too short, flat, or match too weakly (below {@link MIN_CORRELATION}) to be trusted.
 */
export function crossCorrelationOffset(rawA: Trace, rawB: Trace): { offsetS: number; correlation: number; stepS: number } | null {
  const [a, b] = [withoutEmpty(rawA), withoutEmpty(rawB)];
  const spanA = a.time.length ? a.time[a.time.length - 1] - a.time[0] : 0;
  const spanB = b.time.length ? b.time[b.time.length - 1] - b.time[0] : 0;
  if (a.time.length < 4 || b.time.length < 4 || spanA <= 0 || spanB <= 0) return null;
  // The finer of the two runs' own sample spacings, coarsened until neither run exceeds the grid limit.
  const own = Math.min(spanA / (a.time.length - 1), spanB / (b.time.length - 1));
  const step = Math.max(own, Math.max(spanA, spanB) / (MAX_GRID_POINTS - 1));
  const ga = resample(a.time, a.values, step);
  const gb = resample(b.time, b.values, step);
  const found = bestLag(ga, gb, Math.max(2, Math.ceil(MIN_OVERLAP_SHARE * Math.min(ga.length, gb.length))));
  if (!found || found.correlation < MIN_CORRELATION) return null;
  return { offsetS: found.lag * step, correlation: found.correlation, stepS: step };
}
