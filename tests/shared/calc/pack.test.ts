import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { chemistryVoltages, packChemistries } from '../../../shared/calc/chemistry';
import { computePack, type PackResults } from '../../../shared/calc/pack';
import { issueAt, rejected, run } from './helpers';

describe('pack calculator', () => {
  it('gives 2S LiPo voltages: 8.40 full, 7.40 nominal, 6.40 at a 3.2 V/cell cutoff', () => {
    const { results } = run<PackResults>('pack', { chemistry: 'lipo', cells: 2, cutoffPerCellV: 3.2 });
    expect(results.fullV).toBeCloseTo(8.4, 9); // Wikipedia, "Lithium polymer battery": 4.2 V per cell full; race rules 8.40 V for 2S
    expect(results.nominalV).toBeCloseTo(7.4, 9); // Wikipedia, "Lithium polymer battery": 3.7 V nominal; 7.4 V 2S, common practice
    expect(results.cutoffV).toBeCloseTo(6.4, 9); // 2 × 3.2 V (common practice: a LiPo cutoff of 3.0–3.4 V per cell, set per cell, times cells in series)
    expect(results.storageV).toBeCloseTo(7.6, 9); // Battery University BU-303: storage near 3.8 V per cell
    expect(results.cutoffWindowV.min).toBeCloseTo(6.0, 9); // common practice, no source: 3.0–3.4 V per cell
    expect(results.cutoffWindowV.max).toBeCloseTo(6.8, 9); // common practice, no source
    expect(results.cutoffCheck).toBe('in-window');
  });

  it('gives 1S LiPo nominal 3.7 V and per-cell figures', () => {
    const { results } = run<PackResults>('pack', { chemistry: 'LiPo', cells: '1' });
    expect(results.nominalV).toBeCloseTo(3.7, 9); // common practice: 1S is 3.7 V
    expect(results.perCell.fullV).toBeCloseTo(4.2, 9); // Wikipedia, "Lithium polymer battery"
    expect(results.cutoffV).toBeUndefined();
  });

  it('knows LiHV, LiFePO4 and NiMH', () => {
    const lihv = computePack({ chemistry: 'lihv', cells: 2 }).results;
    expect(lihv.fullV).toBeCloseTo(8.7, 9); // from memory: LiHV 4.35 V per cell full
    const lfp = computePack({ chemistry: 'lifepo4', cells: 2 }).results;
    expect(lfp.fullV).toBeCloseTo(7.3, 9); // Faraday Institution BPX LFP 18650 parameter set: 3.65 V upper limit
    expect(lfp.perCell.dischargedV).toBeCloseTo(2.0, 9); // Faraday Institution BPX: 2.0 V lower limit
    const nimh = computePack({ chemistry: 'nimh', cells: 6 }).results;
    expect(nimh.nominalV).toBeCloseTo(7.2, 9); // Wikipedia, "Nickel–metal hydride battery": 1.2 V per cell nominal
    expect(nimh.cutoffWindowV.max).toBeCloseTo(6.0, 9); // Wikipedia, "Nickel–metal hydride battery": 1.0 V end point
    expect(nimh.storageV).toBeNull();
    expect(computePack({ chemistry: 'nimh', cells: 6 }).warnings.find((w) => w.code === 'nimh-care')?.message).toMatch(/storage/);
  });

  it('reads chemistry names in any case and common aliases', () => {
    expect(run<PackResults>('pack', { chemistry: 'LiFePO4', cells: 2 }).results.chemistry).toBe('lifepo4');
    expect(run<PackResults>('pack', { chemistry: 'LiFe', cells: 2 }).results.chemistry).toBe('lifepo4');
    expect(run<PackResults>('pack', { chemistry: ' NIMH ', cells: 6 }).results.chemistry).toBe('nimh');
  });

  it('flags a cutoff below the window as danger with the over-discharge caution', () => {
    const { results, warnings } = computePack({ chemistry: 'lipo', cells: 2, cutoffPerCellV: 2.8 });
    expect(results.cutoffCheck).toBe('below-window');
    const danger = warnings.find((w) => w.code === 'cutoff-below-window');
    expect(danger).toMatchObject({ level: 'danger', field: 'cutoffPerCellV' });
    expect(danger?.message).toMatch(/Over-discharging a lithium cell/);
    expect(danger?.message).toMatch(/maker's instructions/);
  });

  it('notes a cutoff above the window shortens run time, without alarm', () => {
    const { results, warnings } = computePack({ chemistry: 'lipo', cells: 2, cutoffPerCellV: 3.6 });
    expect(results.cutoffCheck).toBe('above-window');
    expect(warnings.find((w) => w.code === 'cutoff-above-window')).toMatchObject({ level: 'info' });
    expect(warnings.some((w) => w.level === 'danger')).toBe(false);
  });

  it('always carries the lithium charging caution, deferring to the maker and the rules', () => {
    for (const chemistry of ['lipo', 'lihv', 'lifepo4'] as const) {
      const care = computePack({ chemistry, cells: 2, cutoffPerCellV: 3.2 }).warnings.find((w) => w.code === 'lithium-care');
      expect(care?.level).toBe('info');
      expect(care?.message).toMatch(/maker's instructions/);
      expect(care?.message).toMatch(/sanctioning body/);
    }
    expect(computePack({ chemistry: 'lihv', cells: 2 }).warnings.map((w) => w.code)).toContain('lihv-race-rules');
  });

  it('places the cutoff window between discharged and full for every chemistry and cell count (property)', () => {
    fc.assert(
      fc.property(fc.constantFrom(...packChemistries), fc.integer({ min: 1, max: 12 }), (chemistry, cells) => {
        const { results } = computePack({ chemistry, cells });
        const emptyV = cells * chemistryVoltages[chemistry].dischargedV;
        expect(results.cutoffWindowV.min).toBeGreaterThanOrEqual(emptyV - 1e-9);
        expect(results.cutoffWindowV.min).toBeLessThanOrEqual(results.cutoffWindowV.max);
        expect(results.cutoffWindowV.max).toBeLessThan(results.nominalV);
        expect(results.nominalV).toBeLessThan(results.fullV);
        if (results.storageV !== null) {
          expect(results.storageV).toBeGreaterThan(results.cutoffWindowV.max);
          expect(results.storageV).toBeLessThan(results.fullV);
        }
      }),
    );
  });

  it('classifies any cutoff against the window consistently (property)', () => {
    fc.assert(
      fc.property(fc.constantFrom(...packChemistries), fc.double({ min: 0.5, max: 4.5, noNaN: true }), (chemistry, cutoff) => {
        const { results, warnings } = computePack({ chemistry, cells: 2, cutoffPerCellV: cutoff });
        const window = chemistryVoltages[chemistry].cutoffWindowV;
        const expected = cutoff < window.min ? 'below-window' : cutoff > window.max ? 'above-window' : 'in-window';
        expect(results.cutoffCheck).toBe(expected);
        expect(warnings.some((w) => w.code === 'cutoff-below-window')).toBe(expected === 'below-window');
      }),
    );
  });

  it('rejects unknown chemistry, fractional cells and a missing cell count, naming each', () => {
    const issues = rejected('pack', { chemistry: 'lead-acid', cells: 2.5 });
    expect(issueAt(issues, 'chemistry').message).toBe('Chemistry must be one of: LiPo, LiHV, LiFePO4, NiMH (got "lead-acid")');
    expect(issueAt(issues, 'cells').message).toBe('Cells must be a whole number');
    expect(issueAt(rejected('pack', { chemistry: 'lipo' }), 'cells').message).toBe('Cells is required');
    expect(issueAt(rejected('pack', { cells: 2 }), 'chemistry').message).toMatch(/Chemistry is required/);
    expect(issueAt(rejected('pack', { chemistry: 'lipo', cells: 2, cutoffPerCellV: 5 }), 'cutoffPerCellV').message).toBe(
      'Cutoff per cell must be at most 4.5 V',
    );
  });
});
