import convert from 'convert-units';
import fc from 'fast-check';
import { unit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import {
  cToF,
  fToC,
  formatFixed,
  formatQuantity,
  formatRatio,
  inToMm,
  kmhToMph,
  mmToIn,
  mphToKmh,
  toDisplay,
  unitOf,
  unitSystemSchema,
} from '../../shared/units';

describe('display units', () => {
  it('converts the fixed points exactly', () => {
    expect(inToMm(1)).toBe(25.4); // NIST SP 811, App. B: 1 in = 25.4 mm exactly
    expect(mmToIn(254)).toBeCloseTo(10, 12); // NIST SP 811, App. B: 1 in = 25.4 mm exactly
    expect(mphToKmh(1)).toBeCloseTo(1.609344, 12); // NIST SP 811, App. B: 1 mi = 1.609344 km exactly
    expect(kmhToMph(160.9344)).toBeCloseTo(100, 10); // NIST SP 811, App. B
    expect(cToF(100)).toBeCloseTo(212, 12); // NIST SP 811, App. B: water boils at 212 °F
    expect(cToF(0)).toBeCloseTo(32, 12); // NIST SP 811, App. B: water freezes at 32 °F
    expect(cToF(-40)).toBeCloseTo(-40, 12); // NIST SP 811, App. B: −40 °C = −40 °F
    expect(fToC(160)).toBeCloseTo(71.111, 3); // NIST SP 811, App. B: t/°C = (t/°F − 32)/1.8
  });

  it('agrees with convert-units on tyre sizes, speeds and temperatures', () => {
    // convert-units goes metric → imperial through a rounded 3.28084 ft/m, so lengths agree to about 1e-7.
    expect(mmToIn(62)).toBeCloseTo(convert(62).from('mm').to('in'), 5); // convert-units oracle
    expect(inToMm(2.2)).toBeCloseTo(convert(2.2).from('in').to('mm'), 5); // convert-units oracle
    expect(kmhToMph(50)).toBeCloseTo(convert(50).from('km/h').to('m/h'), 6); // convert-units oracle (m/h is its mph)
    expect(cToF(71)).toBeCloseTo(convert(71).from('C').to('F'), 9); // convert-units oracle
  });

  it('agrees with mathjs across the ranges racers use (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.1, max: 500, noNaN: true }), (mm) => {
        expect(mmToIn(mm)).toBeCloseTo(unit(mm, 'mm').toNumber('inch'), 9); // mathjs oracle
        expect(inToMm(mmToIn(mm))).toBeCloseTo(mm, 9);
      }),
    );
    fc.assert(
      fc.property(fc.double({ min: 0, max: 250, noNaN: true }), (kmh) => {
        expect(kmhToMph(kmh)).toBeCloseTo(unit(kmh, 'km/h').toNumber('mi/h'), 9); // mathjs oracle
        expect(mphToKmh(kmhToMph(kmh))).toBeCloseTo(kmh, 9);
      }),
    );
    fc.assert(
      fc.property(fc.double({ min: -60, max: 300, noNaN: true }), (c) => {
        expect(cToF(c)).toBeCloseTo(unit(c, 'degC').toNumber('degF'), 9); // mathjs oracle
        expect(fToC(cToF(c))).toBeCloseTo(c, 9);
      }),
    );
  });

  it('formats each quantity with its unit and fixed decimals in both systems', () => {
    // 62 mm = 2.4409… in (convert-units: 2.440944881889764), shown to two decimals.
    expect(formatQuantity('length', 62, 'metric')).toBe('62.0 mm');
    expect(formatQuantity('length', 62, 'imperial')).toBe('2.44 in'); // convert-units: 62 mm = 2.4409 in
    // 22.51 mm per turn = 0.8862 in (convert-units: 0.886220…).
    expect(formatQuantity('rollout', 22.51, 'imperial')).toBe('0.886 in'); // convert-units: 22.51 mm = 0.88622 in
    expect(formatQuantity('speed', 45.24, 'metric')).toBe('45.2 km/h');
    expect(formatQuantity('speed', 45.24, 'imperial')).toBe('28.1 mph'); // mathjs: 45.24 km/h = 28.111 mi/h
    expect(formatQuantity('temperature', 71.1, 'metric')).toBe('71 °C');
    expect(formatQuantity('temperature', 71.1, 'imperial')).toBe('160 °F'); // NIST SP 811: 71.1 °C = 159.98 °F
    expect(formatQuantity('speed', 1609.344, 'imperial')).toBe('1,000.0 mph'); // NIST SP 811: 1 mi = 1.609344 km
    expect(formatQuantity('length', Number.NaN, 'metric')).toBe('—');
    expect(formatQuantity('length', null, 'imperial')).toBe('—');
    expect(unitOf('speed', 'imperial')).toBe('mph');
    expect(toDisplay('temperature', 100, 'imperial')).toBeCloseTo(212, 12); // NIST SP 811, App. B
  });

  it('writes ratios as N.NN:1 and never shows −0', () => {
    expect(formatRatio(5.4166)).toBe('5.42:1'); // common practice: final drive written to two decimals, ":1"
    expect(formatRatio(9, 2)).toBe('9.00:1');
    expect(formatRatio(undefined)).toBe('—');
    expect(formatFixed(-0.0001, 1)).toBe('0.0');
    expect(formatFixed(1234.5, 1)).toBe('1,234.5');
  });

  it('accepts only the two systems', () => {
    expect(unitSystemSchema.safeParse('imperial').success).toBe(true);
    expect(unitSystemSchema.safeParse('furlongs').success).toBe(false);
  });
});
