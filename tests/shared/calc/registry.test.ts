import { describe, expect, it } from 'vitest';
import { calculatorNames, calculators, getCalculator, runCalculator } from '../../../shared/calc/registry';
import { issueAt, rejected } from './helpers';

// The fixed contract from content-spec.md ("Calculators"): names, input keys and result keys.
const contract: Record<string, { inputs: string[]; results: string[] }> = {
  gearing: {
    inputs: ['spur', 'pinion', 'internalRatio', 'tyreDiameterMm'],
    results: ['finalDriveRatio', 'rolloutMm', 'rolloutIn', 'kmhPer1000Rpm', 'tyreCircumferenceMm', 'pinionSweep'],
  },
  motor: {
    inputs: ['kv', 'volts', 'poles'],
    results: ['noLoadRpm', 'ktNmPerA', 'polePairs', 'electricalRpm', 'electricalHz'],
  },
  'top-speed': {
    inputs: ['kv', 'volts', 'spur', 'pinion', 'internalRatio', 'tyreDiameterMm', 'loadFactor'],
    results: ['noLoadRpm', 'finalDriveRatio', 'noLoadKmh', 'noLoadMph', 'loadedKmh', 'loadedMph'],
  },
  'timing-curve': {
    inputs: ['baseDeg', 'rampDeg', 'rampStartRpm', 'rampEndRpm', 'atRpm', 'endbellDeg', 'poles', 'stepDeg', 'stepDelayS', 'maxRpm'],
    results: ['points', 'maxTotalDeg'],
  },
  pack: {
    inputs: ['chemistry', 'cells', 'cutoffPerCellV'],
    results: ['fullV', 'nominalV', 'storageV', 'cutoffWindowV', 'perCell'],
  },
  throttle: { inputs: ['expoPct', 'punchRatePctPerS', 'inputPct'], results: ['points', 'rampTimeMs'] },
  brake: {
    inputs: ['dragBrakePct', 'initialBrakePct', 'brakeStrengthPct', 'brakeStickPct'],
    results: ['atNeutralPct', 'points', 'neutralFeel'],
  },
  temperature: { inputs: ['value', 'unit', 'part'], results: ['c', 'f', 'band'] },
  'run-time': { inputs: ['capacityMah', 'averageCurrentA', 'usablePct', 'raceMin'], results: ['usableMah', 'runTimeMin', 'runTimeToEmptyMin', 'cRate'] },
  'measured-kv': { inputs: ['noLoadRpm', 'testVoltageV'], results: ['measuredKv', 'ktNmPerA'] },
  'winding-resistance': { inputs: ['direction', 'resistanceOhm', 'tempC'], results: ['r20Ohm', 'rAtTempOhm', 'changePct'] },
  'electrical-degrees': { inputs: ['degrees', 'from', 'poles'], results: ['mechanicalDeg', 'electricalDeg', 'polePairs'] },
  'bench-verdict': { inputs: ['reference', 'measured', 'tolerance', 'spread'], results: ['delta', 'deltaPct', 'verdict', 'label'] },
};

describe('calculator registry', () => {
  it('holds exactly the calculators of the content spec and the bench ones', () => {
    expect([...calculatorNames].sort()).toEqual(Object.keys(contract).sort());
    for (const name of calculatorNames) expect(calculators[name].name).toBe(name);
    expect(getCalculator('gearing')).toBe(calculators.gearing);
    expect(getCalculator('toString')).toBeUndefined();
  });

  describe.each(calculatorNames)('%s', (name) => {
    const calculator = calculators[name];

    it('has the contract input keys as fields, each with a label', () => {
      expect(calculator.fields.map((f) => f.key)).toEqual(contract[name].inputs);
      for (const field of calculator.fields) {
        expect(field.label.length).toBeGreaterThan(0);
        if (field.kind === 'select') expect(field.options!.length).toBeGreaterThan(1);
        else expect(field.min).toBeLessThan(field.max!);
      }
    });

    it('computes its defaults and returns the contract result keys', () => {
      const result = runCalculator(name, calculator.defaults);
      expect(result.ok).toBe(true);
      if (!result.ok) return;
      expect(Object.keys(result.output.results as object)).toEqual(expect.arrayContaining(contract[name].results));
      for (const warning of result.output.warnings) expect(['info', 'caution', 'danger']).toContain(warning.level);
    });

    it('rejects an unknown key by name', () => {
      const issues = rejected(name, { ...calculator.defaults, notAField: 1 });
      expect(issueAt(issues, 'notAField').message).toMatch(/^Unknown field "notAField"/);
    });

    it('names every missing required field', () => {
      const required = calculator.fields.filter((f) => !f.optional);
      const issues = rejected(name, {});
      for (const field of required) expect(issueAt(issues, field.key).message).toMatch(new RegExp(`^${field.label.replace(/[()]/g, '\\$&')} is required`));
    });

    it('names every number field that is out of range', () => {
      for (const field of calculator.fields.filter((f) => f.kind === 'number')) {
        const tooBig = rejected(name, { ...calculator.defaults, [field.key]: field.max! + 1 });
        expect(issueAt(tooBig, field.key).message).toMatch(/must be at most/);
        const tooSmall = rejected(name, { ...calculator.defaults, [field.key]: field.min! - 1 });
        expect(issueAt(tooSmall, field.key).message).toMatch(/must be at least/);
      }
    });
  });

  it('reports an unknown calculator and non-object input as issues, not exceptions', () => {
    const unknown = runCalculator('gear-ratio', {});
    expect(unknown).toEqual({
      ok: false,
      issues: [{ path: '', message: expect.stringMatching(/Unknown calculator "gear-ratio"/) }],
    });
    for (const raw of [null, 'spur=84', 42, [1, 2]]) {
      const result = runCalculator('gearing', raw);
      expect(result.ok).toBe(false);
      if (!result.ok) expect(result.issues[0].path).toBe('');
    }
  });

  it('keeps a boolean from being read as a number', () => {
    expect(issueAt(rejected('motor', { kv: true, volts: 8.4, poles: 2 }), 'kv').message).toBe('Motor kV must be a number (got true)');
  });
});
