import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { COPPER_ALPHA_20C, resistanceAt20C, resistanceAtTemp, type WindingResistanceResults } from '../../../shared/calc/winding-resistance';
import { expectRelClose, issueAt, rejected, run } from './helpers';

describe('winding-resistance calculator', () => {
  it('uses copper’s coefficient 0.00393 per K', () => {
    expect(COPPER_ALPHA_20C).toBe(0.00393); // IEC 60028, International standard of resistance for copper: α20 = 0.00393 /K
  });

  it('gives R(T) from R20', () => {
    expect(resistanceAtTemp(0.1, 50)).toBeCloseTo(0.11179, 5); // IEC 60028: 0.1 Ω at 20 °C → 0.11179 Ω at 50 °C
    const { results } = run<WindingResistanceResults>('winding-resistance', { direction: 'from-20c', resistanceOhm: 0.1, tempC: 50 });
    expect(results.rAtTempOhm).toBeCloseTo(0.11179, 5); // IEC 60028 worked vector
    expect(results.r20Ohm).toBe(0.1);
    expect(results.changePct).toBeCloseTo(11.79, 2); // IEC 60028: 30 K × 0.00393 = 11.79 %
  });

  it('refers a reading to 20 °C', () => {
    expect(resistanceAt20C(0.11179, 50)).toBeCloseTo(0.1, 5); // IEC 60028: 0.11179 Ω at 50 °C → 0.1000 Ω at 20 °C
    const { results } = run<WindingResistanceResults>('winding-resistance', { direction: 'to-20c', resistanceOhm: '0.11179', tempC: '50' });
    expect(results.r20Ohm).toBeCloseTo(0.1, 5); // IEC 60028 worked vector, backwards
  });

  it('leaves a reading at 20 °C as it is, and the two directions undo each other (property)', () => {
    expect(resistanceAt20C(0.0215, 20)).toBe(0.0215); // IEC 60028: the reference temperature is 20 °C
    fc.assert(
      fc.property(fc.double({ min: 0.001, max: 10, noNaN: true }), fc.double({ min: -40, max: 200, noNaN: true }), (r, t) => {
        expectRelClose(resistanceAt20C(resistanceAtTemp(r, t), t), r, 1e-12);
      }),
    );
  });

  it('refuses winding temperatures below −40 °C or above 200 °C by field', () => {
    expect(issueAt(rejected('winding-resistance', { direction: 'to-20c', resistanceOhm: 0.02, tempC: -41 }), 'tempC').message).toMatch(/at least -40/);
    expect(issueAt(rejected('winding-resistance', { direction: 'to-20c', resistanceOhm: 0.02, tempC: 201 }), 'tempC').message).toMatch(/at most 200/);
  });

  it('cautions about handling a hot motor, deferring to the maker', () => {
    const { warnings } = run('winding-resistance', { direction: 'to-20c', resistanceOhm: 0.02, tempC: 75 });
    expect(warnings.find((w) => w.code === 'hot-motor')?.message).toMatch(/maker/);
  });
});
