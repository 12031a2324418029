import { corr } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { bestLag, crossCorrelationOffset } from '../../../shared/runlog/align';
import { parseRunlog } from '../../../shared/runlog/parse';
import { simulateRunCsv } from '../../../shared/runlog/simulate';

/** A deterministic, non-periodic signal (a sum of incommensurate sines plus a step), so only one lag matches. */
const signal = (i: number) => Math.sin(i * 0.13) + 0.6 * Math.sin(i * 0.031 + 1) + 0.3 * Math.sin(i * 0.57) + (i % 97 < 20 ? 1.5 : 0);

/** b is a delayed by k samples: b[i + k] = a[i]. */
function shifted(n: number, k: number) {
  const a = Array.from({ length: n }, (_v, i) => signal(i + 50));
  const b = Array.from({ length: n }, (_v, i) => signal(i - k + 50));
  return { a, b };
}

/**
 * Independent oracle: for every lag, the Pearson correlation of the overlapping slices computed by mathjs' `corr`
 * (a general statistics library, no prefix sums), keeping the lag with the highest one.
 */
function bruteForce(a: number[], b: number[], minOverlap: number) {
  let best = { lag: 0, correlation: -Infinity };
  for (let k = -(a.length - 1); k <= b.length - 1; k++) {
    const i0 = Math.max(0, -k);
    const i1 = Math.min(a.length, b.length - k);
    if (i1 - i0 < minOverlap) continue;
    const r = corr(a.slice(i0, i1), b.slice(i0 + k, i1 + k)) as number;
    if (r > best.correlation) best = { lag: k, correlation: r };
  }
  return best;
}

describe('bestLag (normalised cross-correlation)', () => {
  // Source: construction. A trace delayed by k samples must come back as lag k, with correlation 1.
  for (const k of [0, 1, 7, 40, -3, -25]) {
    it(`finds a shift of ${k} samples in a signal shifted by ${k}`, () => {
      const { a, b } = shifted(300, k);
      const found = bestLag(a, b, 150);
      expect(found?.lag).toBe(k);
      expect(found?.correlation).toBeCloseTo(1, 9);
    });
  }

  it('agrees with a brute-force Pearson correlation at every lag (mathjs corr) on noisy, unequal traces', () => {
    // A seeded pseudo-random noise (mulberry-style LCG) added to both; lengths differ.
    let s = 12345;
    const noise = () => ((s = (s * 1103515245 + 12345) % 2147483648) / 2147483648 - 0.5) * 0.8;
    const a = Array.from({ length: 180 }, (_v, i) => signal(i) + noise());
    const b = Array.from({ length: 230 }, (_v, i) => signal(i - 17) + noise());
    const oracle = bruteForce(a, b, 90);
    const found = bestLag(a, b, 90)!;
    expect(found.lag).toBe(oracle.lag);
    expect(found.correlation).toBeCloseTo(oracle.correlation, 9);
    expect(found.lag).toBe(17); // and it is the shift the traces were built with (construction)
  });

  it('returns null for a flat trace (no correlation is defined)', () => {
    expect(bestLag(new Array(50).fill(3), shifted(50, 2).b, 10)).toBeNull();
  });
});

describe('crossCorrelationOffset (seconds, runs at different sample rates)', () => {
  it('recovers a 1.5 s delay between a 20 Hz and a 50 Hz recording of the same trace', () => {
    const f = (t: number) => signal(t * 10);
    const ta = Array.from({ length: 20 * 40 + 1 }, (_v, i) => i / 20);
    const tb = Array.from({ length: 50 * 40 + 1 }, (_v, i) => i / 50);
    const found = crossCorrelationOffset({ time: ta, values: ta.map(f) }, { time: tb, values: tb.map((t) => f(t - 1.5)) })!;
    // Source: construction (b is a delayed by 1.5 s). The grid is 0.02 s (the finer run's spacing), but the 20 Hz run only
    // pins a moment to within its own 0.05 s sample spacing.
    expect(found.stepS).toBeCloseTo(0.02, 9);
    expect(Math.abs(found.offsetS - 1.5)).toBeLessThanOrEqual(0.05 + 1e-9);
    expect(found.correlation).toBeGreaterThan(0.99);
  });

  it('lines up two simulated runs whose only difference in timing is 1.5 s more idling before the first lap', () => {
    const run = (idleS: number, seed: number, loadScale: number) =>
      parseRunlog(simulateRunCsv({ seed, durationS: 30, rateHz: 20, kvRpmPerV: 4000, cells: 2, capacityMah: 5000, ambientC: 20, idleS, loadScale }));
    const a = run(2, 7, 1);
    const b = run(3.5, 9, 1.2);
    if (!a.ok || !b.ok) throw new Error('simulated runs must parse');
    const found = crossCorrelationOffset(
      { time: a.run.time, values: a.run.channels.throttle_pct! },
      { time: b.run.time, values: b.run.channels.throttle_pct! },
    )!;
    expect(Math.abs(found.offsetS - 1.5)).toBeLessThanOrEqual(0.1); // simulator input above (idle 2 s vs 3.5 s)
  });

  it('skips empty cells and gives up on traces that do not match', () => {
    const t = Array.from({ length: 400 }, (_v, i) => i / 10);
    const withGaps = t.map((x, i) => (i % 9 === 4 ? NaN : signal(x * 10)));
    const found = crossCorrelationOffset({ time: t, values: withGaps }, { time: t, values: t.map((x) => signal((x - 2) * 10)) });
    expect(found && Math.abs(found.offsetS - 2)).toBeLessThanOrEqual(0.1);
    // Unrelated traces (a ramp against a fast square wave) never correlate strongly at any lag with enough overlap.
    expect(crossCorrelationOffset({ time: t, values: t.map((x) => x) }, { time: t, values: t.map((_x, i) => (i % 2 ? 1 : -1)) })).toBeNull();
  });
});
