import fc from 'fast-check';
import { evaluate, unit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { computeSetup, DEFAULT_LOAD_FACTOR } from '../../../shared/setup/computed';
import { compareSetups, diffSetupFields } from '../../../shared/setup/compare';
import { buildSetupRecord, contentLibrary, setupRecordArbitrary } from '../../factories/setup-record';

const library = contentLibrary();

describe('computeSetup', () => {
  it('gives the final drive ratio and rollout of the 84/40, 1.9, 64 mm check vector', () => {
    const c = computeSetup(buildSetupRecord({ gearing: { spurTeeth: 84, pinionTeeth: 40, internalRatio: 1.9, tyreDiameterMm: 64 } }));
    expect(c.gearing?.finalDriveRatio).toBeCloseTo(3.99, 6); // 84/40 × 1.9 (Wikipedia, "Gear train": stage ratios multiply)
    expect(c.gearing?.rolloutMm).toBeCloseTo(50.39, 2); // π × 64 mm / 3.99 (rollout relation, common practice)
    expect(c.gearing?.rolloutIn).toBeCloseTo(1.984, 3); // 50.39 mm / 25.4 (NIST SP 811, Appendix B)
  });

  it('gives 2S LiPo pack voltages and the 3.2 V per cell cutoff as 6.40 V', () => {
    const c = computeSetup(buildSetupRecord());
    expect(c.pack?.fullV).toBeCloseTo(8.4, 6); // Wikipedia "Lithium polymer battery": 4.2 V per cell full
    expect(c.pack?.nominalV).toBeCloseTo(7.4, 6); // same article: 3.7 V nominal
    expect(c.pack?.cutoffV).toBeCloseTo(6.4, 6); // 2 × 3.2 V: the cutoff is set per cell (common practice: LiPo 3.0–3.4 V per cell)
    expect(c.pack?.cutoffCheck).toBe('in-window');
  });

  it('gives the no-load speed of 5,700 rpm/V on a nominal 3S LiPo (11.1 V) as 63,270 rpm', () => {
    const c = computeSetup(buildSetupRecord({ motor: { kvRpmPerV: 5700, poles: 2, sensored: true }, battery: { chemistry: 'lipo', cells: 3 } }));
    expect(c.motor?.volts).toBeCloseTo(11.1, 6); // 3 × 3.7 V, Wikipedia "Lithium polymer battery"
    expect(c.motor?.noLoadRpm).toBe(63_270); // Wikipedia, "Motor constants": 5,700 rpm/V × 11.1 V = 63,270 rpm
  });

  it('estimates top speed with the road-speed relation, checked with mathjs units', () => {
    const c = computeSetup(buildSetupRecord());
    // common practice relation v = rpm × π d / FDR; mathjs as the independent oracle
    const expected = evaluate(`2200 * 7.4 * ${DEFAULT_LOAD_FACTOR} / minute * pi * 62 mm / (84 / 32 * 2.6)`).toNumber('km/h');
    expect(c.speed?.loadedKmh).toBeCloseTo(expected, 2);
  });

  it('adds controller timing at the chosen rpm to endbell timing in electrical degrees', () => {
    const c = computeSetup(
      buildSetupRecord({
        motor: { kvRpmPerV: 2000, poles: 4, sensored: true, endbellTimingDeg: 10 },
        escSettings: {
          'static-timing': { value: 0, unit: 'deg' },
          'ramped-advance': { value: 30, unit: 'deg' },
          'ramp-start-rpm': { value: 10_000, unit: 'rpm' },
          'ramp-end-rpm': { value: 30_000, unit: 'rpm' },
        },
      }),
      { atRpm: 20_000 },
    );
    expect(c.timing?.controllerDeg).toBeCloseTo(15, 6); // half of a 30° lead rising linearly over 10k–30k rpm at 20k (from memory; general industrial servo-drive practice)
    expect(c.timing?.endbellElectricalDeg).toBeCloseTo(20, 6); // mechanical degrees × pole pairs (Ohio University EE notes, ch. 14, §14.3): 10° × 2
    expect(c.timing?.totalDeg).toBeCloseTo(35, 6); // 15° + 20°: controller and endbell timing add (common practice)
  });

  it('counts no electronic timing in zero-timing mode, whatever else is set', () => {
    const c = computeSetup(buildSetupRecord({ escSettings: { 'zero-timing-mode': { value: 1, unit: '' }, 'static-timing': { value: 10, unit: 'deg' } } }));
    expect(c.timing?.controllerDeg).toBe(0); // zero-timing spec classes: no electronic advance of any kind (club and national spec-class rulebooks; common practice)
    expect(c.timing?.totalDeg).toBe(30); // only the endbell: 30° mechanical on the factory's 2-pole motor × 1 pole pair
  });

  it('flags a LiPo cutoff under 3.0 V per cell as danger', () => {
    const c = computeSetup(buildSetupRecord({ escSettings: { 'low-voltage-cutoff': { value: 2.9, unit: 'V' } } }));
    expect(c.pack?.cutoffCheck).toBe('below-window');
    expect(c.cautions[0]).toMatchObject({ level: 'danger', code: 'cutoff-below-window', source: 'pack' });
  });

  it('asks for zero-timing mode in stock touring', () => {
    const c = computeSetup(buildSetupRecord({ vehicle: { class: 'touring-stock', chassis: '', drivetrain: '4wd' }, escSettings: {} }));
    expect(c.cautions.map((w) => w.code)).toContain('zero-timing-class');
  });

  it('leaves speeds out, with a note, when the motor is given by wind only', () => {
    const c = computeSetup(buildSetupRecord({ motor: { windTurns: 13.5, poles: 2, sensored: true } }));
    expect(c.motor).toBeNull();
    expect(c.speed).toBeNull();
    expect(c.cautions.map((w) => w.code)).toContain('no-kv');
  });
});

describe('compareSetups', () => {
  const a = buildSetupRecord();
  const b = buildSetupRecord({
    gearing: { ...a.gearing, pinionTeeth: 34 },
    escSettings: { ...a.escSettings, 'low-voltage-cutoff': { value: 2.9, unit: 'V' } },
  });

  it('gives the deltas of a two-tooth pinion change and a lower cutoff from outside relations', () => {
    const cmp = compareSetups(a, b);
    const d = Object.fromEntries(cmp.deltas.map((x) => [x.key, x]));
    // 84 spur, 2.6 internal, 62 mm tyres, pinion 32 → 34; mathjs evaluates each relation independently.
    const fdr = (pinion: number) => evaluate(`84 / ${pinion} * 2.6`); // Wikipedia, "Gear train": stage ratios multiply
    const rollout = (pinion: number) => evaluate(`pi * 62 / (84 / ${pinion} * 2.6)`); // rollout = π × tyre / FDR (common practice)
    expect(d.finalDriveRatio.a).toBeCloseTo(6.825, 3); // 84/32 × 2.6
    expect(d.finalDriveRatio.delta).toBeCloseTo(fdr(34) - fdr(32), 3); // −0.4015
    expect(d.rolloutMm.delta).toBeCloseTo(rollout(34) - rollout(32), 2); // +1.78 mm
    // Loaded speed: 2200 rpm/V × 7.4 V (Wikipedia, "Motor constants": no-load rpm ≈ Kv × V) × the record's load
    // factor, through the rollout; mathjs converts mm per minute to km/h.
    const kmh = (pinion: number) => unit(2200 * 7.4 * DEFAULT_LOAD_FACTOR * rollout(pinion), 'mm/minute').toNumber('km/hour');
    expect(d.loadedKmh.delta).toBeCloseTo(kmh(34) - kmh(32), 1);
    expect(d.cutoffV.b).toBeCloseTo(5.8, 6); // 2 × 2.9 V: the cutoff is set per cell (common practice)
    expect(d.cutoffPerCellV.delta).toBeCloseTo(-0.3, 6); // 2.9 V − 3.2 V, as entered
  });

  it('lists the changed fields and the cutoff danger on the new side', () => {
    const cmp = compareSetups(a, b);
    expect(cmp.differences.map((f) => f.path)).toEqual(['escSettings.low-voltage-cutoff', 'gearing.pinionTeeth']);
    expect(cmp.cautions[0]).toMatchObject({ side: 'b', level: 'danger', code: 'cutoff-below-window' });
  });

  it('warns about heat when timing goes up on taller gearing', () => {
    const timed = (pinion: number, ramp: number) =>
      buildSetupRecord({
        motor: { kvRpmPerV: 5500, poles: 2, sensored: true, endbellTimingDeg: 30 },
        gearing: { spurTeeth: 81, pinionTeeth: pinion, internalRatio: 2.5, tyreDiameterMm: 60 },
        escSettings: {
          'static-timing': { value: 10, unit: 'deg' },
          'ramped-advance': { value: ramp, unit: 'deg' },
          'ramp-start-rpm': { value: 14_000, unit: 'rpm' },
          'ramp-end-rpm': { value: 30_000, unit: 'rpm' },
        },
      });
    expect(compareSetups(timed(23, 16), timed(25, 24)).cautions.map((c) => c.code)).toContain('heat-timing-and-gearing');
    expect(compareSetups(timed(23, 16), timed(21, 24)).cautions.map((c) => c.code)).not.toContain('heat-timing-and-gearing');
  });

  it('warns about heat when the pinion goes up on a setup whose notes warn of high temperatures', () => {
    const geared = (pinion: number, notes?: string, ambientTempC?: number) =>
      buildSetupRecord({
        gearing: { spurTeeth: 81, pinionTeeth: pinion, internalRatio: 2.5, tyreDiameterMm: 60 },
        ...(notes ? { notes } : {}),
        ...(ambientTempC !== undefined ? { conditions: { surface: 'clay' as const, ambientTempC } } : {}),
      });
    const codes = (x: ReturnType<typeof geared>, y: ReturnType<typeof geared>) => compareSetups(x, y).cautions.map((c) => c.code);
    // common practice: a taller pinion loads the motor; guides that note 75–80 °C motors are running near the usual limit
    expect(codes(geared(23, 'Aim for under 75 °C after five minutes.'), geared(25))).toContain('heat-pinion-up');
    expect(codes(geared(23, 'Check the motor: 176 °F is too hot.'), geared(24))).toContain('heat-pinion-up');
    expect(codes(geared(23, undefined, 33), geared(24))).toContain('heat-pinion-up'); // hot day: 33 °C air
    // No heat in the notes, or the pinion goes down or stays: no such caution.
    expect(codes(geared(23, 'Blow dust out between rounds.'), geared(25))).not.toContain('heat-pinion-up');
    expect(codes(geared(23, 'Aim for under 75 °C.'), geared(22))).not.toContain('heat-pinion-up');
    expect(codes(geared(23, 'Aim for under 75 °C.'), geared(23))).not.toContain('heat-pinion-up');
    // 45 °C is a warm pack, not a hot motor note.
    expect(codes(geared(23, 'Packs come off at 45 °C.'), geared(25))).not.toContain('heat-pinion-up');
  });

  it('deltas reverse sign when the sides swap, and a record compared with itself has no differences (property)', () => {
    fc.assert(
      fc.property(setupRecordArbitrary(library), setupRecordArbitrary(library), (x, y) => {
        expect(diffSetupFields(x, x).some((f) => f.changed)).toBe(false);
        const forward = compareSetups(x, y).deltas;
        const back = compareSetups(y, x).deltas;
        forward.forEach((d, i) => {
          if (d.delta === null) expect(back[i].delta).toBeNull();
          else expect(back[i].delta! + d.delta).toBeCloseTo(0, 2);
        });
      }),
      { numRuns: 100 },
    );
  });
});

describe('diffSetupFields', () => {
  it('shows a baseline added to a revision that had none', () => {
    const rows = diffSetupFields(null, buildSetupRecord());
    expect(rows.length).toBeGreaterThan(10);
    expect(rows.every((r) => r.a === null && r.changed)).toBe(true);
  });
});
