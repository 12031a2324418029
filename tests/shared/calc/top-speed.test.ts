import convert from 'convert-units';
import fc from 'fast-check';
import { evaluate, unit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { computeTopSpeed, type TopSpeedResults } from '../../../shared/calc/top-speed';
import { DISPLAY_REL, expectRelClose, issueAt, rejected, run } from './helpers';

const checkVector = {
  kv: 4000,
  volts: 8.4,
  spur: 84,
  pinion: 40,
  internalRatio: 1.9,
  tyreDiameterMm: 64,
  loadFactor: 0.85,
};

describe('top-speed calculator', () => {
  it('matches the 33,600 rpm, 84/40, 1.9, 64 mm check vector', () => {
    const { results } = run<TopSpeedResults>('top-speed', checkVector);
    expect(results.noLoadRpm).toBe(33_600); // Wikipedia, "Motor constants": no-load speed ≈ Kv × V
    expect(results.finalDriveRatio).toBeCloseTo(3.99, 6); // REFERENCES.md gearing checks
    expect(results.noLoadKmh).toBeCloseTo(101.59, 2); // REFERENCES.md gearing checks
    expectRelClose(results.noLoadMph, 63.12, 1e-3); // REFERENCES.md gearing checks (63.12 there is 63.1248… cut to 2 decimals)
    expectRelClose(results.noLoadMph, unit(101.58918559818784, 'km/h').toNumber('mi/h'), DISPLAY_REL); // NIST SP 811 App. B mile; mathjs oracle
    // mathjs oracle: 33,600 /min × π × 64 mm / 3.99
    expectRelClose(results.noLoadKmh, evaluate('33600 / minute * pi * 64 mm / 3.99').toNumber('km/h'), DISPLAY_REL);
    // convert-units oracle ("m/h" is miles per hour there)
    expectRelClose(results.noLoadMph, convert(results.noLoadKmh).from('km/h').to('m/h'), DISPLAY_REL);
  });

  it('scales the loaded speed by the load factor', () => {
    const { results } = computeTopSpeed(checkVector);
    expectRelClose(results.loadedKmh, 101.58918559818784 * 0.85, DISPLAY_REL); // mathjs value above × load factor
    expect(results.loadedRpm).toBe(28_560);
  });

  it('uses the exact mile: 1 mph = 1.609344 km/h (property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 500, max: 10_000 }),
        fc.double({ min: 3, max: 30, noNaN: true }),
        fc.double({ min: 0.5, max: 1, noNaN: true }),
        (kv, volts, loadFactor) => {
          const r = computeTopSpeed({ ...checkVector, kv, volts, loadFactor }).results;
          // NIST SP 811, Appendix B: mile per hour = 1.609344 km/h; mathjs as oracle
          expectRelClose(r.noLoadMph, unit(r.noLoadKmh, 'km/h').toNumber('mi/h'), 2 * DISPLAY_REL);
          expectRelClose(r.loadedMph, unit(r.loadedKmh, 'km/h').toNumber('mi/h'), 2 * DISPLAY_REL);
          expect(r.loadedKmh).toBeLessThanOrEqual(r.noLoadKmh);
        },
      ),
    );
  });

  it('cautions at high speed, deferring to the track and sanctioning body', () => {
    const fast = computeTopSpeed({ ...checkVector, kv: 6000, volts: 8.4 });
    const caution = fast.warnings.find((w) => w.code === 'high-speed');
    expect(caution?.level).toBe('caution');
    expect(caution?.message).toMatch(/sanctioning body/);
    expect(computeTopSpeed({ ...checkVector, kv: 2000 }).warnings.map((w) => w.code)).not.toContain('high-speed');
  });

  it('always carries the spinning-drivetrain note', () => {
    const note = computeTopSpeed(checkVector).warnings.find((w) => w.code === 'spinning-drivetrain');
    expect(note?.message).toMatch(/fingers/);
  });

  it('rejects a load factor outside 0.5–1 and a missing tyre, naming each', () => {
    const issues = rejected('top-speed', { ...checkVector, loadFactor: 0.4, tyreDiameterMm: undefined });
    expect(issueAt(issues, 'loadFactor').message).toBe('Load factor must be at least 0.5');
    expect(issueAt(issues, 'tyreDiameterMm').message).toBe('Tyre diameter is required');
    expect(issueAt(rejected('top-speed', { ...checkVector, loadFactor: 1.2 }), 'loadFactor').message).toBe(
      'Load factor must be at most 1',
    );
  });
});
