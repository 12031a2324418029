import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { benchVerdict, CLOSE_SHARE, type BenchVerdictResults } from '../../../shared/calc/bench-verdict';
import { run } from './helpers';

// Verdict rules (ours, after the guard-band idea of ILAC-G8:09/2019): with tolerance T, spread s and
// guard g = max(s, 0.2 T): s ≥ T → can't tell; |d| ≤ T − g → clearly within; ≤ T → within but close;
// ≤ T + s → can't tell; beyond → clearly outside. The edges are built exactly from small integers so
// they are exact in floating point.
const tol = fc.integer({ min: 10, max: 10_000 });
const sign = fc.constantFrom(1, -1);

describe('bench verdict', () => {
  it('calls the tolerance limit itself within (but close), and just past it outside', () => {
    fc.assert(
      fc.property(tol, sign, (t, sg) => {
        expect(benchVerdict(sg * t, t)).toBe('within_close');
        expect(benchVerdict(sg * (t + t * 1e-9), t)).toBe('clearly_outside');
        expect(benchVerdict(sg * (t - t * 1e-9), t)).toBe('within_close');
      }),
    );
  });

  it('with no spread, the close band is the last fifth of the tolerance', () => {
    expect(CLOSE_SHARE).toBe(0.2);
    fc.assert(
      fc.property(tol, sign, (t5, sg) => {
        const t = t5 * 5; // 0.8 t is then a whole number
        const edge = 0.8 * t;
        expect(benchVerdict(sg * edge, t)).toBe('clearly_within');
        expect(benchVerdict(sg * (edge + 1e-6), t)).toBe('within_close');
        expect(benchVerdict(0, t)).toBe('clearly_within');
      }),
    );
  });

  it('a spread wider than the close band widens it, and reaches past the limit as "can’t tell"', () => {
    fc.assert(
      fc.property(tol, fc.integer({ min: 21, max: 99 }), sign, (t100, pct, sg) => {
        const t = t100 * 100;
        const s = (t * pct) / 100; // between 0.21 T and 0.99 T, exact
        expect(benchVerdict(sg * (t - s), t, s)).toBe('clearly_within');
        expect(benchVerdict(sg * (t - s + 1e-6), t, s)).toBe('within_close');
        expect(benchVerdict(sg * (t + 1e-6), t, s)).toBe('cant_tell');
        expect(benchVerdict(sg * (t + s), t, s)).toBe('cant_tell');
        expect(benchVerdict(sg * (t + s + 1e-6), t, s)).toBe('clearly_outside');
      }),
    );
  });

  it('cannot tell whenever the spread is as large as the tolerance, whatever the change', () => {
    fc.assert(
      fc.property(tol, fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.double({ min: 1, max: 5, noNaN: true }), (t, d, k) => {
        expect(benchVerdict(d, t, t)).toBe('cant_tell');
        expect(benchVerdict(d, t, t * k)).toBe('cant_tell');
      }),
    );
    expect(benchVerdict(0, 10, 10 - 1e-9)).toBe('clearly_within'); // just under: judged again
  });

  it('is symmetric in the sign of the change (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 1e5, noNaN: true }),
        fc.double({ min: 0.01, max: 1e4, noNaN: true }),
        fc.double({ min: 0, max: 1e4, noNaN: true }),
        (d, t, s) => {
          expect(benchVerdict(-d, t, s)).toBe(benchVerdict(d, t, s));
        },
      ),
    );
  });

  it('refuses a zero tolerance or a negative spread', () => {
    expect(() => benchVerdict(1, 0)).toThrow();
    expect(() => benchVerdict(1, 1, -1)).toThrow();
  });

  it('runs as a calculator', () => {
    const { results } = run<BenchVerdictResults>('bench-verdict', { reference: 2310, measured: 2400, tolerance: 69.3 });
    expect(results.verdict).toBe('clearly_outside');
    expect(results.deltaPct).toBeCloseTo(3.896, 3); // 90 / 2310 × 100, checked by hand (from memory: arithmetic)
  });
});
