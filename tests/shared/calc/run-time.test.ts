import { unit, type Unit } from 'mathjs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { computeRunTime, type RunTimeResults } from '../../../shared/calc/run-time';
import { issueAt, rejected, run } from './helpers';

describe('run-time calculator', () => {
  it('gives minutes from capacity and average current (mathjs as the oracle)', () => {
    const full = run<RunTimeResults>('run-time', { capacityMah: 5000, averageCurrentA: 20, usablePct: 100 }).results;
    // 5,000 mAh at 20 A: charge ÷ current, in minutes (NIST SP 811: the ampere-hour, 1 A·h = 3600 C)
    expect(full.runTimeMin).toBeCloseTo((unit('5000 mA hour').divide(unit('20 A')) as Unit).toNumber('minute'), 9); // 15 min
    expect(full.runTimeMin).toBeCloseTo(15, 9);
    expect(full.cRate).toBeCloseTo(4, 9); // 20 A ÷ 5 Ah: the C rate (current as a multiple of capacity in Ah; common practice)
  });

  it('plans on 80 % of the capacity by default', () => {
    const r = run<RunTimeResults>('run-time', { capacityMah: 5000, averageCurrentA: 20 }).results;
    expect(r.usableMah).toBe(4000); // 80 % of 5,000 mAh (common practice: keep a reserve above the cutoff)
    expect(r.runTimeMin).toBeCloseTo((unit('4000 mA hour').divide(unit('20 A')) as Unit).toNumber('minute'), 9); // 12 min, mathjs
    expect(r.runTimeToEmptyMin).toBeCloseTo(15, 9); // the whole 5,000 mAh at 20 A (mathjs above)
  });

  it('gives the highest average current that lasts a race, and warns when the pack runs short', () => {
    const { results, warnings } = computeRunTime({ capacityMah: 4000, averageCurrentA: 40, usablePct: 80, raceMin: 5 });
    // 3,200 mAh over 5 minutes: charge ÷ time (mathjs)
    expect(results.maxAverageCurrentForRaceA).toBeCloseTo((unit('3200 mA hour').divide(unit('5 minute')) as Unit).toNumber('A'), 9); // 38.4 A
    expect(results.lastsRace).toBe(false); // 40 A > 38.4 A
    expect(warnings.map((w) => w.code)).toEqual(['short-of-race']);
    expect(warnings[0].message).toMatch(/do not lower the cutoff/);
    expect(computeRunTime({ capacityMah: 4000, averageCurrentA: 30, raceMin: 5 }).warnings).toEqual([]);
  });

  it('cautions when planning on more than 80 % of the capacity', () => {
    const w = computeRunTime({ capacityMah: 5000, averageCurrentA: 20, usablePct: 95 }).warnings;
    expect(w).toEqual([expect.objectContaining({ level: 'caution', code: 'deep-discharge', field: 'usablePct' })]);
    expect(w[0].message).toMatch(/maker's limits/);
  });

  it('halves the run time when the current doubles (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 100, max: 30_000 }), fc.double({ min: 0.1, max: 250, noNaN: true }), (capacityMah, averageCurrentA) => {
        const once = computeRunTime({ capacityMah, averageCurrentA }).results.runTimeToEmptyMin;
        const twice = computeRunTime({ capacityMah, averageCurrentA: averageCurrentA * 2 }).results.runTimeToEmptyMin;
        expect(Math.abs(twice * 2 - once)).toBeLessThanOrEqual(1e-3 * once);
      }),
    );
  });

  it('rejects a missing capacity, a zero current and an unknown field, naming each', () => {
    const issues = rejected('run-time', { averageCurrentA: 0, volts: 7.4 });
    expect(issueAt(issues, 'capacityMah').message).toBe('Capacity is required');
    expect(issueAt(issues, 'averageCurrentA').message).toMatch(/Average current must be at least 0.1/);
    expect(issueAt(issues, 'volts').message).toMatch(/volts/);
  });
});
