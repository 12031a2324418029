import fc from 'fast-check';
import { evaluate } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { computeThrottle, throttleOutputPct, type ThrottleResults } from '../../../shared/calc/throttle';
import { issueAt, rejected, run } from './helpers';

describe('throttle calculator', () => {
  it('is linear at zero expo', () => {
    const { results } = run<ThrottleResults>('throttle', { expoPct: 0, punchRatePctPerS: 400, inputPct: 37 });
    expect(results.outputPctAt).toBeCloseTo(37, 9); // common practice, no source: 0 expo is a straight line
    for (const p of results.points) expect(p.outputPct).toBeCloseTo(p.inputPct, 9);
  });

  it('follows the documented cubic blend (mathjs evaluating the same expression)', () => {
    // y = (1 − k)x + k x³ with k = 0.4, x = 0.5 — the curve documented in shared/calc/throttle.ts
    expect(throttleOutputPct(50, 40)).toBeCloseTo(evaluate('100 * ((1 - 0.4) * 0.5 + 0.4 * 0.5^3)'), 9);
    expect(throttleOutputPct(50, 100)).toBeCloseTo(12.5, 9);
    // the negative side is the mirror image: y(−e, x) = 100 − y(e, 100 − x)
    expect(throttleOutputPct(30, -60)).toBeCloseTo(100 - throttleOutputPct(70, 60), 9);
  });

  it('times the punch ramp from the rate limit out[n+1] ≤ out[n] + rate × Δt', () => {
    // REFERENCES.md "Throttle and brake" (common practice): 100 % at 400 %/s takes 0.25 s
    expect(run<ThrottleResults>('throttle', { expoPct: 0, punchRatePctPerS: 400 }).results.rampTimeMs).toBeCloseTo(
      250,
      9,
    );
    expect(run<ThrottleResults>('throttle', { expoPct: 0, punchRatePctPerS: 1000 }).results.rampTimeMs).toBeCloseTo(
      100,
      9,
    );
    const half = computeThrottle({ expoPct: 0, punchRatePctPerS: 400, inputPct: 50 }).results;
    expect(half.rampTimeToOutputMs).toBeCloseTo(125, 9); // 50 % at 400 %/s
  });

  it('never lets the step response rise faster than the punch rate and settles on the target', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: -100, max: 100 }),
        fc.integer({ min: 10, max: 10_000 }),
        fc.integer({ min: 1, max: 100 }),
        (expoPct, rate, inputPct) => {
          const r = computeThrottle({ expoPct, punchRatePctPerS: rate, inputPct }).results;
          for (let i = 1; i < r.stepResponse.length; i++) {
            const dt = (r.stepResponse[i].timeMs - r.stepResponse[i - 1].timeMs) / 1000;
            const rise = r.stepResponse[i].outputPct - r.stepResponse[i - 1].outputPct;
            // Displayed values carry 5 significant figures (relative error ≤ 5e-5 each), hence the slack.
            const slack = 1e-4 * 100 + (rate * 1e-4 * r.stepResponse[i].timeMs) / 1000;
            expect(rise).toBeLessThanOrEqual(rate * dt + slack);
            expect(rise).toBeGreaterThanOrEqual(0);
          }
          expect(r.stepResponse.at(-1)!.outputPct).toBeCloseTo(r.outputPctAt!, 2);
        },
      ),
    );
  });

  it('is monotonic in input and stays within 0..100 for any expo (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -100, max: 100, noNaN: true }),
        fc.double({ min: 0, max: 100, noNaN: true }),
        fc.double({ min: 0, max: 100, noNaN: true }),
        (expo, a, b) => {
          const [low, high] = a <= b ? [a, b] : [b, a];
          const yLow = throttleOutputPct(low, expo);
          const yHigh = throttleOutputPct(high, expo);
          expect(yHigh).toBeGreaterThanOrEqual(yLow);
          for (const y of [yLow, yHigh]) {
            expect(y).toBeGreaterThanOrEqual(0);
            expect(y).toBeLessThanOrEqual(100);
          }
        },
      ),
    );
    fc.assert(
      fc.property(fc.integer({ min: -100, max: 100 }), (expo) => {
        const { points } = computeThrottle({ expoPct: expo, punchRatePctPerS: 400 }).results;
        expect(points[0].outputPct).toBe(0);
        expect(points.at(-1)!.outputPct).toBeCloseTo(100, 9);
        for (let i = 1; i < points.length; i++)
          expect(points[i].outputPct).toBeGreaterThanOrEqual(points[i - 1].outputPct);
      }),
    );
  });

  it('cautions about very hard punch and notes very soft punch', () => {
    const hard = computeThrottle({ expoPct: 0, punchRatePctPerS: 5000 }).warnings.find((w) => w.code === 'hard-punch');
    expect(hard?.level).toBe('caution');
    expect(hard?.message).toMatch(/makers/);
    expect(computeThrottle({ expoPct: 0, punchRatePctPerS: 50 }).warnings.map((w) => w.code)).toEqual(['soft-punch']);
    expect(computeThrottle({ expoPct: 0, punchRatePctPerS: 400 }).warnings).toEqual([]);
  });

  it('rejects out-of-range expo, a missing rate and unknown keys, naming each', () => {
    const issues = rejected('throttle', { expoPct: -150, punch: 400 });
    expect(issueAt(issues, 'expoPct').message).toBe('Throttle curve (expo) must be at least -100%');
    expect(issueAt(issues, 'punchRatePctPerS').message).toBe('Punch rate is required');
    expect(issueAt(issues, 'punch').message).toMatch(/Did you mean "punchRatePctPerS"/);
    expect(
      issueAt(rejected('throttle', { expoPct: 0, punchRatePctPerS: 400, inputPct: 101 }), 'inputPct').message,
    ).toBe('Stick position must be at most 100%');
  });
});
