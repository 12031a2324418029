import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseWorkedExample } from '../../../shared/calc/worked-example';
import { runCalculator } from '../../../shared/calc/registry';

describe('parseWorkedExample', () => {
  it('reads a good block into validated inputs and keeps the raw values', () => {
    const result = parseWorkedExample('calc: gearing\nspur: 78\npinion: 34\ninternalRatio: 2.6\ntyreDiameterMm: 62\n');
    expect(result).toEqual({
      ok: true,
      calc: 'gearing',
      inputs: { spur: 78, pinion: 34, internalRatio: 2.6, tyreDiameterMm: 62 },
      rawInputs: { spur: 78, pinion: 34, internalRatio: 2.6, tyreDiameterMm: 62 },
    });
    if (!result.ok) return;
    const run = runCalculator(result.calc, result.inputs);
    expect(run.ok && (run.output.results as { finalDriveRatio: number }).finalDriveRatio).toBeCloseTo((78 / 34) * 2.6, 3); // Wikipedia "Gear train"
  });

  it('normalises choices and quoted numbers, and leaves optional fields out', () => {
    const result = parseWorkedExample('calc: pack\nchemistry: LiPo\ncells: "2"\n');
    expect(result).toMatchObject({
      ok: true,
      calc: 'pack',
      inputs: { chemistry: 'lipo', cells: 2 },
      rawInputs: { chemistry: 'LiPo', cells: '2' },
    });
    if (result.ok) expect('cutoffPerCellV' in result.inputs && result.inputs.cutoffPerCellV !== undefined).toBe(false);
  });

  it('tolerates comments, blank lines and Windows line endings', () => {
    const result = parseWorkedExample(
      '# a stock buggy on 2S\r\ncalc: brake\r\n\r\ndragBrakePct: 10   # light\r\ninitialBrakePct: 15\r\nbrakeStrengthPct: 80\r\n',
    );
    expect(result.ok).toBe(true);
  });

  it('reports an unknown calculator on the calc line', () => {
    const result = parseWorkedExample('calc: gearbox\nspur: 78\n');
    expect(result).toMatchObject({ ok: false, calc: 'gearbox' });
    if (result.ok) return;
    expect(result.issues).toEqual([{ path: 'calc', message: expect.stringMatching(/^Unknown calculator "gearbox"\. Known calculators: gearing, /) }]);
  });

  it('reports a missing calc line', () => {
    const result = parseWorkedExample('spur: 78\npinion: 34\n');
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.issues[0]).toEqual({ path: 'calc', message: 'Missing "calc:" line naming the calculator.' });
  });

  it('reports an unknown key by name with a suggestion', () => {
    const result = parseWorkedExample('calc: gearing\nspur: 78\npinion: 34\ninternalRatio: 2.6\ntyreDiameter: 62\n');
    expect(result.ok).toBe(false);
    if (result.ok) return;
    const unknown = result.issues.find((i) => i.path === 'tyreDiameter');
    expect(unknown?.message).toMatch(/Unknown field "tyreDiameter"\. Did you mean "tyreDiameterMm"\?/);
    expect(result.issues.find((i) => i.path === 'tyreDiameterMm')?.message).toBe('Tyre diameter is required');
  });

  it('reports a bad value on its field', () => {
    const result = parseWorkedExample('calc: timing-curve\nbaseDeg: lots\nrampDeg: 30\nrampStartRpm: 10000\nrampEndRpm: 30000\n');
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.issues).toEqual([{ path: 'baseDeg', message: 'Base timing must be a number (got "lots")' }]);
    const range = parseWorkedExample('calc: temperature\nvalue: 75\nunit: K\n');
    expect(!range.ok && range.issues).toEqual([{ path: 'unit', message: 'Unit must be one of: °C, °F (got "K")' }]);
  });

  it('reports a YAML syntax error with its line', () => {
    const result = parseWorkedExample('calc: gearing\nspur: [78\npinion: 34\n');
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.issues[0].message).toMatch(/^Syntax error in the worked example at line \d+/);
    const duplicate = parseWorkedExample('calc: gearing\nspur: 78\nspur: 80\n');
    expect(!duplicate.ok && duplicate.issues[0].message).toMatch(/unique/);
  });

  it('reports an empty block and a block that is not key: value lines', () => {
    expect(parseWorkedExample('   \n')).toMatchObject({
      ok: false,
      issues: [{ path: '', message: expect.stringMatching(/empty/) }],
    });
    expect(parseWorkedExample('- spur\n- pinion\n')).toMatchObject({
      ok: false,
      issues: [{ path: '', message: expect.stringMatching(/key: value/) }],
    });
    expect(parseWorkedExample('just some text')).toMatchObject({ ok: false, issues: [{ path: '' }] });
  });

  it('never throws, whatever the body (property)', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 200 }), (body) => {
        const result = parseWorkedExample(body);
        expect(typeof result.ok).toBe('boolean');
        if (!result.ok) expect(result.issues.length).toBeGreaterThan(0);
      }),
    );
    fc.assert(
      fc.property(fc.dictionary(fc.constantFrom('calc', 'spur', 'pinion', 'kv', '[', '&a', '*a', '!!x'), fc.string({ maxLength: 12 })), (entries) => {
        const body = Object.entries(entries)
          .map(([k, v]) => `${k}: ${v}`)
          .join('\n');
        expect(() => parseWorkedExample(body)).not.toThrow();
      }),
    );
  });
});
