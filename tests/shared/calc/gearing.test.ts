import convert from 'convert-units';
import fc from 'fast-check';
import { evaluate, unit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import {
  computeGearing,
  finalDriveRatio,
  gearingCalculator,
  gearingInput,
  type GearingResults,
} from '../../../shared/calc/gearing';
import { DISPLAY_REL, expectRelClose, issueAt, rejected, run } from './helpers';

describe('gearing calculator', () => {
  it('matches the 84/40, 1.9 internal, 64 mm check vector', () => {
    const { results } = run<GearingResults>('gearing', {
      spur: 84,
      pinion: 40,
      internalRatio: 1.9,
      tyreDiameterMm: 64,
    });
    expect(results.finalDriveRatio).toBeCloseTo(3.99, 6); // REFERENCES.md gearing checks; stage ratio relation, Wikipedia "Gear train"
    expect(results.tyreCircumferenceMm).toBeCloseTo(201.06, 2); // REFERENCES.md gearing checks (π × 64 mm)
    expectRelClose(results.tyreCircumferenceMm, evaluate('pi * 64 mm').toNumber('mm'), DISPLAY_REL); // mathjs oracle
    expect(results.rolloutMm).toBeCloseTo(50.39, 2); // REFERENCES.md gearing checks
    expect(results.rolloutIn).toBeCloseTo(1.984, 3); // REFERENCES.md gearing checks
    expectRelClose(results.rolloutIn, convert(results.rolloutMm).from('mm').to('in'), DISPLAY_REL); // convert-units oracle
    // 1 in = 25.4 mm exactly: NIST SP 811, Appendix B; mathjs as oracle
    expectRelClose(results.rolloutIn, unit(results.rolloutMm, 'mm').toNumber('inch'), DISPLAY_REL);
    // speed per 1000 motor rpm: mathjs oracle on the common-practice relation v = rpm × π d / FDR
    expectRelClose(results.kmhPer1000Rpm, evaluate('1000 / minute * pi * 64 mm / 3.99').toNumber('km/h'), DISPLAY_REL);
  });

  it('matches the direct-drive 78/40, 44 mm check vector', () => {
    const { results } = run<GearingResults>('gearing', { spur: 78, pinion: 40, internalRatio: 1, tyreDiameterMm: 44 });
    expect(results.finalDriveRatio).toBeCloseTo(1.95, 6); // REFERENCES.md gearing checks
    expect(results.rolloutMm).toBeCloseTo(70.89, 2); // REFERENCES.md gearing checks
    expect(results.rolloutIn).toBeCloseTo(2.791, 3); // REFERENCES.md gearing checks
    expectRelClose(results.rolloutIn, convert(results.rolloutMm).from('mm').to('in'), DISPLAY_REL); // convert-units oracle
  });

  it('accepts values as strings, as query strings and worked examples give them', () => {
    const { results } = run<GearingResults>('gearing', {
      spur: '84',
      pinion: ' 40 ',
      internalRatio: '1.9',
      tyreDiameterMm: '64',
    });
    expect(results.finalDriveRatio).toBeCloseTo(3.99, 6); // REFERENCES.md gearing checks
  });

  it('sweeps six pinions either side, with the chosen pinion matching the main result', () => {
    const { results } = computeGearing({ spur: 84, pinion: 40, internalRatio: 1.9, tyreDiameterMm: 64 });
    expect(results.pinionSweep.map((p) => p.pinion)).toEqual([34, 35, 36, 37, 38, 39, 40, 41, 42, 43, 44, 45, 46]);
    const chosen = results.pinionSweep.find((p) => p.pinion === 40)!;
    expect(chosen.finalDriveRatio).toBe(results.finalDriveRatio);
    expect(chosen.rolloutMm).toBe(results.rolloutMm);
    // 84/34 × 1.9 = 4.6941…: stage ratio relation, Wikipedia "Gear train"
    expect(results.pinionSweep[0].finalDriveRatio).toBeCloseTo((84 / 34) * 1.9, 3);
  });

  it('keeps the sweep inside the pinion limits', () => {
    const { results } = computeGearing({ spur: 40, pinion: 7, internalRatio: 1, tyreDiameterMm: 64 });
    expect(results.pinionSweep[0].pinion).toBe(5);
    expect(results.pinionSweep.at(-1)!.pinion).toBe(13);
  });

  it('cautions about motor heat on very tall gearing and defers to the makers', () => {
    // 60/40 direct on 64 mm: rollout ≈ 134 mm, far taller than any common class (common practice, no source)
    const { warnings } = computeGearing({ spur: 60, pinion: 40, internalRatio: 1, tyreDiameterMm: 64 });
    const tall = warnings.find((w) => w.code === 'tall-gearing');
    expect(tall?.level).toBe('caution');
    expect(tall?.message).toMatch(/temperature/i);
    expect(tall?.message).toMatch(/maker/i);
  });

  it('notes very short crawler gearing and stays quiet for ordinary gearing', () => {
    const crawler = computeGearing({ spur: 87, pinion: 11, internalRatio: 30, tyreDiameterMm: 110 });
    expect(crawler.warnings.map((w) => w.code)).toContain('short-gearing');
    const ordinary = computeGearing({ spur: 84, pinion: 40, internalRatio: 1.9, tyreDiameterMm: 64 });
    expect(ordinary.warnings).toEqual([]);
  });

  it('final drive ratio falls as the pinion grows (property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 10, max: 200 }),
        fc.integer({ min: 5, max: 99 }),
        fc.double({ min: 0.5, max: 60, noNaN: true }),
        fc.double({ min: 20, max: 250, noNaN: true }),
        (spur, pinion, internalRatio, tyreDiameterMm) => {
          const smaller = computeGearing({ spur, pinion, internalRatio, tyreDiameterMm }).results;
          const larger = computeGearing({ spur, pinion: pinion + 1, internalRatio, tyreDiameterMm }).results;
          expect(larger.finalDriveRatio).toBeLessThan(smaller.finalDriveRatio);
          expect(larger.rolloutMm).toBeGreaterThan(smaller.rolloutMm);
        },
      ),
    );
  });

  it('rollout × final drive ratio = tyre circumference (property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 10, max: 200 }),
        fc.integer({ min: 5, max: 100 }),
        fc.double({ min: 0.5, max: 60, noNaN: true }),
        fc.double({ min: 20, max: 250, noNaN: true }),
        (spur, pinion, internalRatio, tyreDiameterMm) => {
          const r = computeGearing({ spur, pinion, internalRatio, tyreDiameterMm }).results;
          expectRelClose(r.rolloutMm * r.finalDriveRatio, Math.PI * tyreDiameterMm, 2 * DISPLAY_REL);
          expectRelClose(r.finalDriveRatio, finalDriveRatio(spur, pinion, internalRatio), DISPLAY_REL);
        },
      ),
    );
  });

  it('rejects missing, out-of-range, non-numeric and unknown fields, naming each', () => {
    const issues = rejected('gearing', { pinion: 0, internalRatio: 'two', tyreDiameterMm: 64, tyreSize: 64 });
    expect(issueAt(issues, 'spur').message).toBe('Spur is required');
    expect(issueAt(issues, 'pinion').message).toBe('Pinion must be at least 5 teeth');
    expect(issueAt(issues, 'internalRatio').message).toBe('Internal ratio must be a number (got "two")');
    expect(issueAt(issues, 'tyreSize').message).toMatch(/Unknown field "tyreSize"/);
    expect(
      issueAt(rejected('gearing', { spur: 84.5, pinion: 40, internalRatio: 1.9, tyreDiameterMm: 64 }), 'spur').message,
    ).toBe('Spur must be a whole number');
    expect(
      issueAt(rejected('gearing', { spur: '', pinion: 40, internalRatio: 1.9, tyreDiameterMm: 64 }), 'spur').message,
    ).toBe('Spur is required');
  });

  it('exposes a schema, fields and defaults that agree', () => {
    expect(gearingCalculator.fields.map((f) => f.key)).toEqual(['spur', 'pinion', 'internalRatio', 'tyreDiameterMm']);
    expect(gearingInput.safeParse(gearingCalculator.defaults).success).toBe(true);
    expect(gearingCalculator.fields.find((f) => f.key === 'tyreDiameterMm')).toMatchObject({
      unit: 'mm',
      kind: 'number',
      min: 20,
      max: 250,
    });
  });
});
