import fc from 'fast-check';
import { abs, diff, mean } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { CONTROL_LIMITS_MIN_POINTS, INDIVIDUALS_FACTOR, individualsLimits, limitsWhenEnough, meanAndSpread } from '../../../shared/calc/control-limits';

describe('individuals control chart limits', () => {
  it('uses 2.66 = 3 / d₂ with d₂ = 1.128 for n = 2', () => {
    // NIST/SEMATECH e-Handbook of Statistical Methods, section 6.3.2: d₂ = 1.128 for moving ranges of two
    expect(3 / 1.128).toBeCloseTo(INDIVIDUALS_FACTOR, 2);
    expect(INDIVIDUALS_FACTOR).toBe(2.66); // same section: limits x̄ ± 2.66 MR̄
  });

  it('matches an independent computation with mathjs on a data vector', () => {
    // Invented kV readings of one motor over ten checks; the oracle is mathjs's mean, diff and abs.
    const kv = [2312, 2305, 2318, 2309, 2301, 2315, 2296, 2310, 2307, 2299];
    const xbar = mean(kv) as number;
    const mrbar = mean(abs(diff(kv)) as number[]) as number;
    const limits = individualsLimits(kv);
    expect(limits.mean).toBeCloseTo(xbar, 9);
    expect(limits.meanMovingRange).toBeCloseTo(mrbar, 9);
    expect(limits.upper).toBeCloseTo(xbar + 2.66 * mrbar, 9); // NIST/SEMATECH 6.3.2
    expect(limits.lower).toBeCloseTo(xbar - 2.66 * mrbar, 9);
    // by hand: x̄ = 2307.2, moving ranges 7,13,9,8,14,19,14,3,8 → MR̄ = 95/9
    expect(limits.mean).toBeCloseTo(2307.2, 9); // from memory: arithmetic done by hand
    expect(limits.meanMovingRange).toBeCloseTo(95 / 9, 9);
  });

  it('agrees with mathjs for any series (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: -1e4, max: 1e4, noNaN: true }), { minLength: 2, maxLength: 40 }), (xs) => {
        const l = individualsLimits(xs);
        const mr = mean(abs(diff(xs)) as number[]) as number;
        expect(l.upper - l.lower).toBeCloseTo(2 * 2.66 * mr, 6);
        expect(l.mean).toBeCloseTo(mean(xs) as number, 6);
      }),
    );
  });

  it('gives no limits before eight checks', () => {
    expect(CONTROL_LIMITS_MIN_POINTS).toBe(8);
    expect(limitsWhenEnough([1, 2, 3, 4, 5, 6, 7])).toBeNull();
    expect(limitsWhenEnough([1, 2, 3, 4, 5, 6, 7, 8])?.n).toBe(8);
    expect(() => individualsLimits([5])).toThrow();
  });

  it('gives mean and spread of repeat readings', () => {
    // mathjs oracle for the mean; spread is the range (largest minus smallest)
    const r = [31_480, 31_520, 31_505];
    expect(meanAndSpread(r).mean).toBeCloseTo(mean(r) as number, 9);
    expect(meanAndSpread(r).spread).toBe(40);
  });
});
