import { describe, expect, it } from 'vitest';
import { electricalToMechanicalDeg, mechanicalToElectricalDeg, type ElectricalDegreesResults } from '../../../shared/calc/electrical-degrees';
import { issueAt, rejected, run } from './helpers';

describe('electrical-degrees calculator', () => {
  it('multiplies mechanical degrees by pole pairs', () => {
    // Electrical rpm = mechanical rpm × pole pairs, so angles scale the same way (common practice;
    // the synchronous-speed relation n = 120·f/P, Ohio University basic EE notes, ch. 14, §14.3)
    expect(mechanicalToElectricalDeg(15, 4)).toBe(30);
    expect(mechanicalToElectricalDeg(30, 2)).toBe(30);
    expect(electricalToMechanicalDeg(30, 4)).toBe(15);
    // 360 electrical degrees per pole pair: one mechanical turn of a 4-pole rotor is 720 electrical degrees (same source)
    expect(mechanicalToElectricalDeg(360, 4)).toBe(720);
  });

  it('converts both ways through the registry', () => {
    expect(run<ElectricalDegreesResults>('electrical-degrees', { degrees: 15, from: 'mechanical', poles: 4 }).results).toEqual({
      mechanicalDeg: 15,
      electricalDeg: 30,
      polePairs: 2,
    }); // as above
    expect(run<ElectricalDegreesResults>('electrical-degrees', { degrees: 30, from: 'Electrical', poles: 6 }).results.mechanicalDeg).toBe(10); // 3 pole pairs
  });

  it('refuses an odd pole count by field', () => {
    expect(issueAt(rejected('electrical-degrees', { degrees: 15, from: 'mechanical', poles: 3 }), 'poles').message).toMatch(/even/);
  });
});
