import fc from 'fast-check';
import { evaluate } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { computeMotor, electricalFrequencyHz, torqueConstantFromKv, type MotorResults } from '../../../shared/calc/motor';
import { DISPLAY_REL, expectRelClose, issueAt, rejected, run } from './helpers';

describe('motor calculator', () => {
  it('gives the torque constant from kV', () => {
    const kv4000 = run<MotorResults>('motor', { kv: 4000, volts: 8.4, poles: 2 }).results;
    expect(kv4000.ktNmPerA).toBeCloseTo(0.0023873, 7); // Wikipedia, "Motor constants", section "Motor torque constant"
    const kv3600 = run<MotorResults>('motor', { kv: 3600, volts: 8.4, poles: 2 }).results;
    expect(kv3600.ktNmPerA).toBeCloseTo(0.0026526, 7); // Wikipedia, "Motor constants", section "Motor torque constant"
  });

  it('agrees with mathjs units on Kt = 1 / Kv for any kV (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 100, max: 20_000 }), (kv) => {
        // mathjs oracle: (1 V)/(kv cycle/minute) × 1 rad expressed in N m / A
        const oracle = evaluate(`(1 V) / (${kv} cycle/minute) * 1 rad`).toNumber('N m / A');
        expectRelClose(torqueConstantFromKv(kv), oracle, 1e-9);
        expectRelClose(computeMotor({ kv, volts: 7.4, poles: 2 }).results.ktNmPerA, oracle, DISPLAY_REL);
      }),
    );
  });

  it('gives no-load rpm as kV × volts', () => {
    const { results } = run<MotorResults>('motor', { kv: 5700, volts: 11.1, poles: 2 });
    expect(results.noLoadRpm).toBe(63_270); // Wikipedia, "Motor constants": 5,700 rpm/V × 11.1 V = 63,270 rpm
  });

  it('converts mechanical speed to electrical frequency with f = rpm × poles / 120', () => {
    expect(electricalFrequencyHz(1500, 4)).toBeCloseTo(50, 9); // Ohio University basic EE notes, ch. 14, §14.3: 50 Hz, 4 poles ↔ 1500 rpm
    expect(electricalFrequencyHz(3600, 2)).toBeCloseTo(60, 9); // Ohio University basic EE notes, ch. 14, §14.3: 60 Hz, 2 poles ↔ 3600 rpm
    // the same through the calculator: kV 1500 at 1 V is 1500 rpm
    expect(run<MotorResults>('motor', { kv: 1500, volts: 1, poles: 4 }).results.electricalHz).toBeCloseTo(50, 6); // ch. 14, §14.3
    expect(run<MotorResults>('motor', { kv: 3600, volts: 1, poles: 2 }).results.electricalHz).toBeCloseTo(60, 6); // ch. 14, §14.3
  });

  it('gives electrical rpm as mechanical rpm × pole pairs', () => {
    const { results } = run<MotorResults>('motor', { kv: 4000, volts: 8.4, poles: 4 });
    expect(results.polePairs).toBe(2);
    expect(results.noLoadRpm).toBe(33_600); // 4000 rpm/V × 8.4 V (Wikipedia, "Motor constants": no-load rpm ≈ Kv × V)
    expect(results.electricalRpm).toBe(67_200); // electrical rpm = mechanical rpm × pole pairs (Ohio University EE notes, ch. 14, §14.3: n = 120 f / P)
    // mathjs oracle: electrical rpm / 60 is the electrical frequency in Hz
    expectRelClose(results.electricalHz, evaluate('67200 / minute').toNumber('Hz'), DISPLAY_REL);
  });

  it('cautions about free-revving past common motor ratings, deferring to the maker', () => {
    const fast = computeMotor({ kv: 8000, volts: 8.4, poles: 2 });
    const caution = fast.warnings.find((w) => w.code === 'high-rpm');
    expect(caution?.level).toBe('caution');
    expect(caution?.message).toMatch(/maker/);
    expect(computeMotor({ kv: 4000, volts: 8.4, poles: 2 }).warnings.map((w) => w.code)).not.toContain('high-rpm');
  });

  it('rejects an odd pole count, out-of-range kV and an unknown key, naming each', () => {
    expect(issueAt(rejected('motor', { kv: 4000, volts: 8.4, poles: 3 }), 'poles').message).toMatch(/even/);
    expect(issueAt(rejected('motor', { kv: 50, volts: 8.4, poles: 2 }), 'kv').message).toBe('Motor kV must be at least 100 rpm/V');
    expect(issueAt(rejected('motor', { kv: 4000, volts: 8.4, poles: 2, kV: 1 }), 'kV').message).toMatch(/Did you mean "kv"/);
    expect(issueAt(rejected('motor', { kv: 4000, poles: 2 }), 'volts').message).toBe('Voltage is required');
  });
});
