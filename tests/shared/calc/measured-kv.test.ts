import fc from 'fast-check';
import { evaluate } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { measuredKv, type MeasuredKvResults } from '../../../shared/calc/measured-kv';
import { DISPLAY_REL, expectRelClose, issueAt, rejected, run } from './helpers';

describe('measured-kv calculator', () => {
  it('gives kV = no-load rpm / volts', () => {
    // Wikipedia, "Motor constants": 5,700 rpm/V × 11.1 V = 63,270 rpm, read backwards
    expect(run<MeasuredKvResults>('measured-kv', { noLoadRpm: 63_270, testVoltageV: 11.1 }).results.measuredKv).toBeCloseTo(5700, 6);
    expect(measuredKv(63_270, 11.1)).toBeCloseTo(5700, 9); // same source
  });

  it('gives the torque constant of the measured kV', () => {
    // Wikipedia, "Motor constants", section "Motor torque constant": Kv 4000 rpm/V → 0.0023873 N·m/A
    expect(run<MeasuredKvResults>('measured-kv', { noLoadRpm: 29_600, testVoltageV: 7.4 }).results.ktNmPerA).toBeCloseTo(0.0023873, 7);
  });

  it('agrees with mathjs units for any bench reading (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1000, max: 120_000 }), fc.double({ min: 1, max: 30, noNaN: true }), (rpm, volts) => {
        // mathjs oracle: (rpm cycle/minute) / (volts V) expressed in cycle/minute/V
        const oracle = evaluate(`(${rpm} cycle/minute) / (${volts} V)`).toNumber('cycle/minute/V');
        expectRelClose(run<MeasuredKvResults>('measured-kv', { noLoadRpm: rpm, testVoltageV: volts }).results.measuredKv, oracle, DISPLAY_REL);
      }),
    );
  });

  it('refuses a zero voltage and a negative speed by field', () => {
    expect(issueAt(rejected('measured-kv', { noLoadRpm: 20_000, testVoltageV: 0 }), 'testVoltageV').message).toMatch(/at least/);
    expect(issueAt(rejected('measured-kv', { noLoadRpm: -5, testVoltageV: 7.4 }), 'noLoadRpm').message).toMatch(/at least/);
    expect(() => measuredKv(20_000, 0)).toThrow(RangeError);
  });
});
