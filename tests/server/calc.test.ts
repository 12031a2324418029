/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are read loosely and checked field by field */
import Ajv2020 from 'ajv/dist/2020';
import { evaluate, unit } from 'mathjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { calculatorNames, calculators } from '../../shared/calc/registry';
import { createClient, createTestApp, type TestApp, type TestClient } from '../setup/test-app';

let t: TestApp;
let client: TestClient;
beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  client = createClient(t.app);
});
afterAll(async () => {
  await t.close();
});

type Issue = { path: string; message: string };
const paths = (body: { error: { details?: Issue[] } }) => (body.error.details ?? []).map((d) => d.path);

/** POSTs good input and returns results + warnings, failing with the server's message otherwise. */
async function runGood(name: string, input: Record<string, unknown>) {
  const res = await client.post(`/api/calc/${name}`, input);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  expect(Array.isArray(res.body.data.warnings)).toBe(true);
  return res.body.data as { results: Record<string, any>; warnings: { level: string; code: string; message: string }[] };
}

async function runBad(name: string, input: unknown) {
  const res = await client.post(`/api/calc/${name}`, input);
  expect(res.status).toBe(400);
  expect(res.body.error.code).toBe('validation_failed');
  return res.body as { error: { code: string; message: string; details: Issue[] } };
}

describe('GET /api/calc', () => {
  it('lists every calculator with fields, an example and a JSON Schema that accepts the example', async () => {
    const res = await client.get('/api/calc');
    expect(res.status).toBe(200);
    const list = res.body.data as { name: string; title: string; fields: { key: string }[]; defaults: Record<string, unknown>; inputSchema: any }[];
    expect(list.map((c) => c.name)).toEqual(calculatorNames);
    const ajv = new Ajv2020({ allErrors: true });
    ajv.addKeyword('x-calc-field');
    for (const calc of list) {
      expect(calc.title.length).toBeGreaterThan(3);
      expect(calc.inputSchema.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
      expect(calc.inputSchema.type).toBe('object');
      expect(Object.keys(calc.inputSchema.properties)).toEqual(calc.fields.map((f) => f.key));
      const validate = ajv.compile(calc.inputSchema);
      expect(validate(calc.defaults), `${calc.name}: ${JSON.stringify(validate.errors)}`).toBe(true);
      expect(validate({ ...calc.defaults, notAField: 1 })).toBe(false);
    }
  });

  it('carries each number field’s type and bounds into the JSON Schema', async () => {
    const res = await client.get('/api/calc');
    const gearing = (res.body.data as any[]).find((c) => c.name === 'gearing');
    expect(gearing.inputSchema.properties.pinion).toMatchObject({ type: 'integer', minimum: 5, maximum: 100 });
    expect(gearing.inputSchema.properties.internalRatio).toMatchObject({ type: 'number', minimum: 0.5 });
    expect(gearing.inputSchema.required).toEqual(['spur', 'pinion', 'internalRatio', 'tyreDiameterMm']);
    const temperature = (res.body.data as any[]).find((c) => c.name === 'temperature');
    // `part` has a default, so a caller may leave it out.
    expect(temperature.inputSchema.required).toEqual(['value', 'unit']);
  });
});

describe('POST /api/calc/:name', () => {
  it('answers 404 in the error shape for an unknown calculator', async () => {
    const res = await client.post('/api/calc/flux-capacitor', { a: 1 });
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
    expect(res.body.error.message).toMatch(/flux-capacitor/);
  });

  it('rejects a body that is not an object', async () => {
    const body = await runBad('gearing', [1, 2]);
    expect(paths(body)).toContain('body');
  });

  it('gearing: FDR and rollout for 84/40, 1.9 internal, 64 mm tyre', async () => {
    const { results } = await runGood('gearing', { spur: 84, pinion: 40, internalRatio: 1.9, tyreDiameterMm: 64 });
    expect(results.finalDriveRatio).toBeCloseTo(3.99, 6); // 84/40 × 1.9 (Wikipedia, "Gear train": stage ratios multiply)
    expect(results.rolloutMm).toBeCloseTo(50.39, 2); // π × 64 mm / 3.99 (rollout relation, common practice)
    expect(results.rolloutIn).toBeCloseTo(1.984, 3); // 50.39 mm / 25.4 (NIST SP 811, App. B: 1 in = 25.4 mm)
    expect(results.kmhPer1000Rpm).toBeCloseTo(evaluate('1000 / minute * pi * 64 mm / 3.99').toNumber('km/h'), 3); // mathjs oracle
    expect(results.pinionSweep.length).toBeGreaterThan(5);
  });

  it('gearing: strings from a form are accepted; bad fields are each named', async () => {
    const { results } = await runGood('gearing', { spur: '78', pinion: '40', internalRatio: '1', tyreDiameterMm: '44' });
    expect(results.rolloutMm).toBeCloseTo(70.89, 2); // π × 44 mm / (78/40) (rollout relation, common practice; Wikipedia, "Gear train")
    const body = await runBad('gearing', { spur: 84, pinion: 0, internalRatio: 'fast', tyreDiameterMm: 64 });
    expect(paths(body)).toEqual(expect.arrayContaining(['body.pinion', 'body.internalRatio']));
    expect(body.error.details.find((d) => d.path === 'body.pinion')!.message).toMatch(/Pinion must be at least 5/);
  });

  it('motor: 5,700 rpm/V at 11.1 V is 63,270 rpm; Kt from Kv', async () => {
    const { results } = await runGood('motor', { kv: 5700, volts: 11.1, poles: 2 });
    expect(results.noLoadRpm).toBe(63270); // Wikipedia, "Motor constants" (worked example 5,700 × 11.1)
    const four = await runGood('motor', { kv: 4000, volts: 8.4, poles: 4 });
    expect(four.results.ktNmPerA).toBeCloseTo(0.0023873, 7); // Wikipedia, "Motor constants", §Motor torque constant
    expect(four.results.electricalHz).toBeCloseTo((33600 * 4) / 120, 6); // f = n·P/120, Ohio Univ. basic EE notes §14.3
    expect(four.results.electricalRpm).toBe(67200); // electrical rpm = mechanical × pole pairs (Ohio University EE notes, ch. 14, §14.3: n = 120 f / P)
  });

  it('motor: an odd pole count and a missing kV are named', async () => {
    const body = await runBad('motor', { volts: 7.4, poles: 3 });
    expect(paths(body)).toEqual(expect.arrayContaining(['body.kv', 'body.poles']));
  });

  it('top-speed: 4000 kV on 8.4 V through 3.99:1 on 64 mm tyres', async () => {
    const { results, warnings } = await runGood('top-speed', {
      kv: 4000,
      volts: 8.4,
      spur: 84,
      pinion: 40,
      internalRatio: 1.9,
      tyreDiameterMm: 64,
      loadFactor: 1,
    });
    expect(results.noLoadKmh).toBeCloseTo(101.59, 2); // 33,600 rpm × π × 64 mm / 3.99 (road speed relation, common practice; no-load)
    expect(Math.abs(results.noLoadMph - 63.12)).toBeLessThan(0.01); // 101.59 km/h / 1.609344 (NIST SP 811, Appendix B: 1 mph = 1.609344 km/h)
    expect(results.noLoadMph).toBeCloseTo(unit(results.noLoadKmh, 'km/h').toNumber('mi/h'), 3); // mathjs oracle; 1 mph = 1.609344 km/h (NIST SP 811, App. B)
    expect(warnings.map((w) => w.code)).toContain('high-speed');
  });

  it('top-speed: a load factor above 1 is rejected', async () => {
    const body = await runBad('top-speed', { kv: 4000, volts: 8.4, spur: 84, pinion: 40, internalRatio: 1.9, tyreDiameterMm: 64, loadFactor: 1.4 });
    expect(paths(body)).toEqual(['body.loadFactor']);
  });

  it('timing-curve: half-way up a 30° ramp over 10k–30k rpm is 15°; endbell degrees × pole pairs', async () => {
    const { results } = await runGood('timing-curve', {
      baseDeg: 0,
      rampDeg: 30,
      rampStartRpm: 10000,
      rampEndRpm: 30000,
      atRpm: 20000,
      endbellDeg: 10,
      poles: 4,
    });
    expect(results.totalDegAt).toBe(15); // half of a lead rising linearly between two speeds (from memory; general industrial servo-drive practice)
    expect(results.endbellElectricalDeg).toBe(20); // mechanical × pole pairs = electrical (Ohio University EE notes, ch. 14, §14.3)
    const last = results.points.at(-1);
    expect(last.deg).toBe(30); // at and above the end speed the full lead applies (from memory; general industrial servo-drive practice)
  });

  it('timing-curve: a ramp end below its start is named', async () => {
    const body = await runBad('timing-curve', { baseDeg: 0, rampDeg: 30, rampStartRpm: 20000, rampEndRpm: 10000 });
    expect(paths(body)).toEqual(['body.rampEndRpm']);
  });

  it('pack: 2S LiPo is 8.40 V full, 7.40 V nominal, 6.40 V at 3.2 V/cell, with the lithium caution', async () => {
    const { results, warnings } = await runGood('pack', { chemistry: 'LiPo', cells: 2, cutoffPerCellV: 3.2 });
    expect(results.fullV).toBeCloseTo(8.4, 6); // 2 × 4.20 V (Wikipedia, "Lithium polymer battery": 4.2 V per cell full)
    expect(results.nominalV).toBeCloseTo(7.4, 6); // 2 × 3.7 V (Wikipedia, "Lithium polymer battery": 3.7 V nominal)
    expect(results.cutoffV).toBeCloseTo(6.4, 6); // 2 × 3.2 V (common practice: LiPo cutoff 3.0–3.4 V per cell)
    expect(warnings.map((w) => w.code)).toContain('lithium-care');
  });

  it('pack: a cutoff below the LiPo window is a danger warning; an unknown chemistry is named', async () => {
    const low = await runGood('pack', { chemistry: 'lipo', cells: 2, cutoffPerCellV: 2.8 });
    expect(low.warnings.find((w) => w.code === 'cutoff-below-window')?.level).toBe('danger'); // 3.0 V floor: common practice, no source
    const body = await runBad('pack', { chemistry: 'lead-acid', cells: 0 });
    expect(paths(body)).toEqual(expect.arrayContaining(['body.chemistry', 'body.cells']));
  });

  it('throttle: linear curve passes the stick through; 400 %/s takes 250 ms to full', async () => {
    const { results } = await runGood('throttle', { expoPct: 0, punchRatePctPerS: 400, inputPct: 50 });
    expect(results.outputPctAt).toBe(50); // common practice, no source: 0 expo is a straight line
    expect(results.rampTimeMs).toBe(250); // 100 % / 400 %/s = 0.25 s (common practice, no source: punch as a rate limit)
  });

  it('throttle: expo beyond ±100 % is named', async () => {
    const body = await runBad('throttle', { expoPct: 150, punchRatePctPerS: 400 });
    expect(paths(body)).toEqual(['body.expoPct']);
  });

  it('brake: drag brake at neutral, brake strength at full stick', async () => {
    const { results } = await runGood('brake', { dragBrakePct: 10, initialBrakePct: 15, brakeStrengthPct: 80, brakeStickPct: 100 });
    expect(results.atNeutralPct).toBe(10); // common practice, no source: drag brake is the brake applied at neutral
    expect(results.brakeAtStickPct).toBe(80); // common practice, no source: brake strength is the brake at full brake stick
    expect(typeof results.neutralFeel).toBe('string');
  });

  it('brake: negative drag brake and an unknown field are named', async () => {
    const body = await runBad('brake', { dragBrakePct: -5, initialBrakePct: 15, brakeStrengthPct: 80, dragBrake: 3 });
    expect(paths(body)).toEqual(expect.arrayContaining(['body.dragBrakePct', 'body.dragBrake']));
  });

  it('temperature: 160 °F is 71.1 °C, the hot band for a motor', async () => {
    const { results, warnings } = await runGood('temperature', { value: 160, unit: 'F' });
    expect(results.c).toBeCloseTo(71.111, 3); // NIST SP 811, App. B: t/°C = (t/°F − 32)/1.8
    expect(results.band).toBe('hot'); // motors kept below about 71–82 °C: common practice, no source
    expect(warnings[0].level).toBe('caution');
    const boiling = await runGood('temperature', { value: 100, unit: 'C', part: 'pack' });
    expect(boiling.results.f).toBe(212); // NIST SP 811, App. B
    expect(boiling.results.band).toBe('too-hot');
  });

  it('temperature: an unknown unit is named', async () => {
    const body = await runBad('temperature', { value: 300, unit: 'K' });
    expect(paths(body)).toEqual(['body.unit']);
  });

  it('run-time: 5,000 mAh at 20 A on 80 % is 12 minutes; a missing capacity is named', async () => {
    const { results } = await runGood('run-time', { capacityMah: 5000, averageCurrentA: 20, raceMin: 5 });
    expect(results.runTimeMin).toBe(12); // 4 A·h ÷ 20 A = 0.2 h (NIST SP 811: the ampere-hour; 80 % planned, common practice)
    expect(results.maxAverageCurrentForRaceA).toBe(48); // 4 A·h ÷ (5/60) h
    expect(paths(await runBad('run-time', { averageCurrentA: 20 }))).toEqual(['body.capacityMah']);
  });

  it('measured-kv: 63,270 rpm at 11.1 V is 5,700 rpm/V; a zero voltage is named', async () => {
    const { results } = await runGood('measured-kv', { noLoadRpm: 63270, testVoltageV: 11.1 });
    expect(results.measuredKv).toBeCloseTo(5700, 6); // Wikipedia, "Motor constants": 5,700 rpm/V × 11.1 V = 63,270 rpm
    expect(paths(await runBad('measured-kv', { noLoadRpm: 63270, testVoltageV: 0 }))).toEqual(['body.testVoltageV']);
  });

  it('winding-resistance: 0.1 Ω at 20 °C is 0.11179 Ω at 50 °C and back; 250 °C is named', async () => {
    const up = await runGood('winding-resistance', { direction: 'from-20c', resistanceOhm: 0.1, tempC: 50 });
    expect(up.results.rAtTempOhm).toBeCloseTo(0.11179, 5); // IEC 60028: α20 = 0.00393 /K, 0.1 Ω → 0.11179 Ω at 50 °C
    const down = await runGood('winding-resistance', { direction: 'to-20c', resistanceOhm: 0.11179, tempC: 50 });
    expect(down.results.r20Ohm).toBeCloseTo(0.1, 5); // IEC 60028, the same vector backwards
    expect(paths(await runBad('winding-resistance', { direction: 'to-20c', resistanceOhm: 0.1, tempC: 250 }))).toEqual(['body.tempC']);
  });

  it('electrical-degrees: 15 mechanical degrees on a 4-pole rotor are 30 electrical', async () => {
    const { results } = await runGood('electrical-degrees', { degrees: 15, from: 'mechanical', poles: 4 });
    expect(results.electricalDeg).toBe(30); // electrical = mechanical × pole pairs (common practice; n = 120·f/P, Ohio Univ. basic EE notes §14.3)
    expect(paths(await runBad('electrical-degrees', { degrees: 15, from: 'mechanical', poles: 5 }))).toEqual(['body.poles']);
  });

  it('bench-verdict: a change past the tolerance plus the spread is clearly outside', async () => {
    const { results } = await runGood('bench-verdict', { reference: 30, measured: 38, tolerance: 3, spread: 1 });
    expect(results.verdict).toBe('clearly_outside'); // 8 > 3 + 1 (our rule after ILAC-G8:09/2019 guard bands)
    expect(paths(await runBad('bench-verdict', { reference: 30, measured: 38, tolerance: 0 }))).toEqual(['body.tolerance']);
  });

  it('covers every calculator in this file', () => {
    // Guards against a new calculator landing without API checks above.
    expect(Object.keys(calculators).sort()).toEqual([
      'bench-verdict',
      'brake',
      'electrical-degrees',
      'gearing',
      'measured-kv',
      'motor',
      'pack',
      'run-time',
      'temperature',
      'throttle',
      'timing-curve',
      'top-speed',
      'winding-resistance',
    ]);
  });
});
