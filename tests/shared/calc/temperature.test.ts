import convert from 'convert-units';
import fc from 'fast-check';
import { unit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { computeTemperature, temperatureBand, type TemperatureResults } from '../../../shared/calc/temperature';
import { DISPLAY_REL, expectRelClose, issueAt, rejected, run } from './helpers';

describe('temperature calculator', () => {
  it('converts °F to °C and back', () => {
    const f160 = run<TemperatureResults>('temperature', { value: 160, unit: 'F' }).results;
    expect(f160.c).toBeCloseTo(71.111, 3); // NIST SP 811, App. B: t/°C = (t/°F − 32)/1.8
    expectRelClose(f160.c, convert(160).from('F').to('C'), DISPLAY_REL); // convert-units oracle
    const f180 = run<TemperatureResults>('temperature', { value: 180, unit: 'F' }).results;
    expect(f180.c).toBeCloseTo(82.222, 3); // NIST SP 811, App. B
    const c100 = run<TemperatureResults>('temperature', { value: 100, unit: 'C' }).results;
    expect(c100.f).toBeCloseTo(212, 9); // NIST SP 811, App. B (water boils at 212 °F)
    expect(run<TemperatureResults>('temperature', { value: -40, unit: 'C' }).results.f).toBeCloseTo(-40, 9); // NIST SP 811, App. B: −40 °C = −40 °F
  });

  it('agrees with convert-units and mathjs across the range (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: -60, max: 300, noNaN: true }), (value) => {
        const fromC = computeTemperature({ value, unit: 'C', part: 'motor' }).results;
        expect(Math.abs(fromC.f - convert(value).from('C').to('F'))).toBeLessThanOrEqual(
          1e-4 * Math.max(1, Math.abs(fromC.f)),
        ); // convert-units oracle
        const fromF = computeTemperature({ value, unit: 'F', part: 'motor' }).results;
        expect(Math.abs(fromF.c - unit(value, 'degF').toNumber('degC'))).toBeLessThanOrEqual(
          1e-4 * Math.max(1, Math.abs(fromF.c)),
        ); // mathjs oracle
      }),
    );
  });

  it('bands motor temperatures around the usual 71–82 °C (160–180 °F) limit', () => {
    // common practice, no source: motors kept below about 71–82 °C after a run (REFERENCES.md "Motor")
    expect(temperatureBand(54.9, 'motor')).toBe('cool');
    expect(temperatureBand(55, 'motor')).toBe('warm');
    expect(temperatureBand(70.9, 'motor')).toBe('warm');
    expect(temperatureBand(71, 'motor')).toBe('hot');
    expect(temperatureBand(82, 'motor')).toBe('hot');
    expect(temperatureBand(82.1, 'motor')).toBe('too-hot');
    expect(run<TemperatureResults>('temperature', { value: 165, unit: 'F' }).results.band).toBe('hot'); // 73.9 °C
  });

  it('cautions when hot and warns of danger when too hot, deferring to the maker', () => {
    const hot = computeTemperature({ value: 75, unit: 'C', part: 'motor' }).warnings;
    expect(hot).toHaveLength(1);
    expect(hot[0]).toMatchObject({ level: 'caution', code: 'hot', field: 'value' });
    expect(hot[0].message).toMatch(/maker's limits/);
    const tooHot = computeTemperature({ value: 190, unit: 'F', part: 'motor' }).warnings;
    expect(tooHot[0]).toMatchObject({ level: 'danger', code: 'too-hot' });
    expect(tooHot[0].message).toMatch(/maker's limits/);
    expect(computeTemperature({ value: 40, unit: 'C', part: 'motor' }).warnings).toEqual([]);
  });

  it('treats a lithium pack above about 60 °C as too hot, with the fire caution', () => {
    // common practice, no source: LiPo packs too hot above about 60 °C
    const { results, warnings } = computeTemperature({ value: 61, unit: 'C', part: 'pack' });
    expect(results.band).toBe('too-hot');
    expect(warnings[0].level).toBe('danger');
    expect(warnings[0].message).toMatch(/fire/);
    expect(temperatureBand(45, 'pack')).toBe('warm');
    expect(temperatureBand(86, 'esc')).toBe('too-hot');
    expect(temperatureBand(60, 'esc')).toBe('warm');
  });

  it('bands never get cooler as the reading rises (property)', () => {
    const order = ['cool', 'warm', 'hot', 'too-hot'];
    fc.assert(
      fc.property(
        fc.constantFrom('motor', 'esc', 'pack' as const),
        fc.double({ min: -60, max: 300, noNaN: true }),
        fc.double({ min: -60, max: 300, noNaN: true }),
        (part, a, b) => {
          const [low, high] = a <= b ? [a, b] : [b, a];
          expect(order.indexOf(temperatureBand(high, part))).toBeGreaterThanOrEqual(
            order.indexOf(temperatureBand(low, part)),
          );
        },
      ),
    );
  });

  it('reads units in any common spelling and defaults the part to motor', () => {
    const r = run<TemperatureResults>('temperature', { value: '160', unit: '°f' }).results;
    expect(r.part).toBe('motor');
    expect(r.c).toBeCloseTo(71.111, 3); // NIST SP 811, App. B
    expect(run<TemperatureResults>('temperature', { value: 50, unit: 'c', part: 'ESC' }).results.part).toBe('esc');
    expect(run<TemperatureResults>('temperature', { value: 50, unit: 'Celsius', part: '' }).results.part).toBe('motor');
  });

  it('rejects an unknown unit, an unknown part and a missing value, naming each', () => {
    const issues = rejected('temperature', { unit: 'K', part: 'servo' });
    expect(issueAt(issues, 'value').message).toBe('Temperature is required');
    expect(issueAt(issues, 'unit').message).toBe('Unit must be one of: °C, °F (got "K")');
    expect(issueAt(issues, 'part').message).toMatch(/Part must be one of: Motor, Speed controller \(ESC\), Pack/);
    expect(issueAt(rejected('temperature', { value: 400, unit: 'C' }), 'value').message).toBe(
      'Temperature must be at most 300',
    );
  });
});
