import { parse } from 'csv-parse/sync';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createClient, createTestApp, type TestApp, type TestClient } from '../setup/test-app';
import { signedInClient } from '../factories/user';
import { addCheck, buildCheck, createMotor } from '../factories/motor';

let t: TestApp;
let rosa: TestClient;
let jonah: TestClient;
const MISSING = '00000000-0000-4000-8000-000000000000';
const count = async (table: string) => Number((await t.db.dataSource.query(`SELECT count(*)::int AS n FROM ${table}`))[0].n);

beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  rosa = (await signedInClient(t)).client;
  jonah = (await signedInClient(t)).client;
});
afterAll(async () => {
  await t?.close();
});

function expectFieldError(
  res: { status: number; body: { error: { code: string; details: Array<{ path: string; message: string }> } } },
  path: string,
  message?: RegExp,
) {
  expect(res.status, JSON.stringify(res.body)).toBe(400);
  expect(res.body.error.code).toBe('validation_failed');
  const issue = res.body.error.details.find((d) => d.path === path);
  expect(issue, JSON.stringify(res.body.error.details)).toBeDefined();
  if (message) expect(issue!.message).toMatch(message);
}

describe('POST /api/motors', () => {
  it('registers a motor for the signed-in member (201 with the motor)', async () => {
    const res = await rosa.post('/api/motors', { label: 'Spare 13.5', windTurns: 13.5, poles: 2, sensored: true, rotorNotes: '12.5 mm rotor' });
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({
      label: 'Spare 13.5',
      kvRpmPerV: null,
      windTurns: 13.5,
      poles: 2,
      sensored: true,
      rotorNotes: '12.5 mm rotor',
      checkCount: 0,
      referenceCheckId: null,
    });
  });

  it('401 for a visitor', async () => {
    const res = await createClient(t.app).post('/api/motors', { label: 'x', poles: 2, sensored: true });
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('400 naming the field for an odd pole count, a missing label, unknown fields', async () => {
    expectFieldError(await rosa.post('/api/motors', { label: 'Odd', poles: 3, sensored: true }), 'body.poles', /even/);
    expectFieldError(await rosa.post('/api/motors', { label: '  ', poles: 2, sensored: true }), 'body.label');
    expectFieldError(await rosa.post('/api/motors', { label: 'x', poles: 2, sensored: 'yes' }), 'body.sensored');
    expectFieldError(await rosa.post('/api/motors', { label: 'x', poles: 2, sensored: true, colour: 'blue' }), 'body.colour', /Unknown field/);
    expect(await count('motors')).toBe(1);
  });
});

describe('GET /api/motors', () => {
  it("lists only the caller's motors", async () => {
    const mine = await createMotor(rosa, { label: 'Rosa list motor' });
    const theirs = await createMotor(jonah, { label: 'Jonah list motor' });
    const res = await rosa.get('/api/motors');
    expect(res.status).toBe(200);
    const ids = res.body.data.map((m: { id: string }) => m.id);
    expect(ids).toContain(mine.id);
    expect(ids).not.toContain(theirs.id);
    expect(res.body.meta.total).toBe(ids.length);
  });
});

describe('GET/PATCH/DELETE /api/motors/:id', () => {
  it("answers another member's motor exactly as a missing id (404)", async () => {
    const m = await createMotor(rosa);
    for (const [method, body] of [['get'], ['patch', { label: 'Mine now' }], ['delete']] as const) {
      const other = method === 'get' ? await jonah.get(`/api/motors/${m.id}`) : await jonah[method](`/api/motors/${m.id}`, body);
      const missing = method === 'get' ? await jonah.get(`/api/motors/${MISSING}`) : await jonah[method](`/api/motors/${MISSING}`, body);
      expect(other.status, method).toBe(404);
      expect(other.body, method).toEqual(missing.body);
    }
    expect((await rosa.get(`/api/motors/${m.id}`)).body.data.label).toBe('Club stock 17.5 (blue can)');
  });

  it('changes details and tolerances, and marks a reference that must be its own check', async () => {
    const m = await createMotor(rosa);
    const other = await createMotor(rosa, { label: 'Other' });
    const foreign = await addCheck(rosa, other.id);
    const own = await addCheck(rosa, m.id);
    const res = await rosa.patch(`/api/motors/${m.id}`, { label: 'Blue can', tolerances: { timingDeg: { kind: 'abs', value: 2 } }, referenceCheckId: own.id });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.data).toMatchObject({ label: 'Blue can', tolerances: { timingDeg: { kind: 'abs', value: 2 } }, referenceCheckId: own.id, checkCount: 1 });
    expectFieldError(await rosa.patch(`/api/motors/${m.id}`, { referenceCheckId: foreign.id }), 'body.referenceCheckId');
    expectFieldError(await rosa.patch(`/api/motors/${m.id}`, { poles: 5 }), 'body.poles', /even/);
    expectFieldError(await rosa.patch(`/api/motors/${m.id}`, { tolerances: { timingDeg: { kind: 'abs', value: 0 } } }), 'body.tolerances.timingDeg.value');
    expect((await rosa.get(`/api/motors/${m.id}`)).body.data.referenceCheckId).toBe(own.id);
  });

  it('deletes a motor with its checks', async () => {
    const m = await createMotor(rosa);
    await addCheck(rosa, m.id);
    const before = await count('bench_checks');
    expect((await rosa.delete(`/api/motors/${m.id}`)).status).toBe(204);
    expect((await rosa.get(`/api/motors/${m.id}`)).status).toBe(404);
    expect(await count('bench_checks')).toBe(before - 1);
  });

  it('400 for an id that is not a uuid, 401 for a visitor', async () => {
    expectFieldError(await rosa.get('/api/motors/not-an-id'), 'params.id');
    expect((await createClient(t.app).get(`/api/motors/${MISSING}`)).status).toBe(401);
  });
});

describe('POST /api/motors/:id/checks', () => {
  it('stores a check and computes measured kV and resistance at 20 °C', async () => {
    const m = await createMotor(rosa);
    const res = await rosa.post(
      `/api/motors/${m.id}/checks`,
      buildCheck({ noLoadRpm: 63_270, testVoltageV: 11.1, phaseResistanceOhm: 0.11179, resistanceTempC: 50 }),
    );
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.data.computed.measuredKv).toBeCloseTo(5700, 6); // Wikipedia, "Motor constants": 5,700 rpm/V × 11.1 V = 63,270 rpm
    expect(res.body.data.computed.resistanceAt20COhm).toBeCloseTo(0.1, 5); // IEC 60028: 0.11179 Ω at 50 °C → 0.1000 Ω at 20 °C
    expect(res.body.data).toMatchObject({ testVoltageV: 11.1, noLoadRpm: 63_270, isReference: true, testedAt: '2026-11-02T19:30:00.000Z' });
    expect(res.body.data.readings.noLoadRpm).toEqual({ values: [63_270], mean: 63_270, spread: 0 });
  });

  it('takes up to five repeat readings per quantity and stores their mean and spread', async () => {
    const m = await createMotor(rosa);
    const { testVoltageV: _v, noLoadRpm: _r, ...rest } = buildCheck();
    const res = await rosa.post(`/api/motors/${m.id}/checks`, {
      ...rest,
      testVoltageV: 7.4,
      readings: { noLoadRpm: [17_000, 17_040, 17_020], timingDeg: [29, 31] },
      timingDeg: undefined,
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.data.noLoadRpm).toBe(17_020);
    expect(res.body.data.readings.noLoadRpm).toEqual({ values: [17_000, 17_040, 17_020], mean: 17_020, spread: 40 });
    expect(res.body.data.timingDeg).toBe(30);
    expect(res.body.data.computed.measuredKvSpread).toBeCloseTo((17_020 / 7.4) * (40 / 17_020), 9);
    const six = await rosa.post(`/api/motors/${m.id}/checks`, { testVoltageV: 7.4, readings: { noLoadRpm: [1, 2, 3, 4, 5, 6] } });
    expectFieldError(six, 'body.readings.noLoadRpm', /At most 5/);
    expectFieldError(
      await rosa.post(`/api/motors/${m.id}/checks`, { testVoltageV: 7.4, noLoadRpm: 17_000, readings: { noLoadRpm: [17_000] } }),
      'body.noLoadRpm',
      /not both/,
    );
  });

  it('400 naming the field for physically impossible input, and stores nothing', async () => {
    const m = await createMotor(rosa);
    const before = await count('bench_checks');
    expectFieldError(await rosa.post(`/api/motors/${m.id}/checks`, buildCheck({ noLoadRpm: -100 })), 'body.noLoadRpm');
    expectFieldError(await rosa.post(`/api/motors/${m.id}/checks`, buildCheck({ testVoltageV: 0 })), 'body.testVoltageV', /above 0/);
    expectFieldError(await rosa.post(`/api/motors/${m.id}/checks`, buildCheck({ resistanceTempC: -41 })), 'body.resistanceTempC', /-40/);
    expectFieldError(await rosa.post(`/api/motors/${m.id}/checks`, buildCheck({ resistanceTempC: 201 })), 'body.resistanceTempC', /200/);
    expectFieldError(await rosa.post(`/api/motors/${m.id}/checks`, buildCheck({ resistanceTempC: undefined })), 'body.resistanceTempC', /temperature/);
    expectFieldError(
      await rosa.post(`/api/motors/${m.id}/checks`, buildCheck({ readings: { noLoadCurrentA: [2, -1] }, noLoadCurrentA: undefined })),
      'body.readings.noLoadCurrentA.1',
    );
    expectFieldError(await rosa.post(`/api/motors/${m.id}/checks`, { testVoltageV: 7.4 }), 'body.noLoadRpm', /required/);
    expectFieldError(await rosa.post(`/api/motors/${m.id}/checks`, buildCheck({ noLoadRpm: '17000' })), 'body.noLoadRpm');
    expect(await count('bench_checks')).toBe(before);
  });

  it("404 on another member's motor, as for a missing one; 401 for a visitor", async () => {
    const m = await createMotor(rosa);
    const other = await jonah.post(`/api/motors/${m.id}/checks`, buildCheck());
    const missing = await jonah.post(`/api/motors/${MISSING}/checks`, buildCheck());
    expect(other.status).toBe(404);
    expect(other.body).toEqual(missing.body);
    expect((await createClient(t.app).post(`/api/motors/${m.id}/checks`, buildCheck())).status).toBe(401);
  });
});

describe('GET /api/motors/:id/checks', () => {
  it('lists checks oldest first with the reference marked', async () => {
    const m = await createMotor(rosa);
    const late = await addCheck(rosa, m.id, { testedAt: '2026-11-20T10:00:00Z' });
    const early = await addCheck(rosa, m.id, { testedAt: '2026-11-01T10:00:00Z' });
    const res = await rosa.get(`/api/motors/${m.id}/checks`);
    expect(res.body.data.map((c: { id: string }) => c.id)).toEqual([early.id, late.id]);
    expect(res.body.data.map((c: { isReference: boolean }) => c.isReference)).toEqual([true, false]);
    expect(res.body.meta).toEqual({ total: 2, referenceCheckId: early.id });
    expect((await jonah.get(`/api/motors/${m.id}/checks`)).status).toBe(404);
  });
});

describe('GET /api/motors/:id/compare', () => {
  it('gives change, tolerance and verdict per quantity, and what the moves usually mean', async () => {
    const m = await createMotor(rosa);
    const before = await addCheck(rosa, m.id, { testedAt: '2026-11-01T10:00:00Z' });
    const after = await addCheck(rosa, m.id, {
      testedAt: '2026-11-08T10:00:00Z',
      noLoadRpm: 17_900,
      noLoadCurrentA: 1.7,
      timingDeg: 38,
      phaseResistanceOhm: 0.0216,
    });
    const res = await rosa.get(`/api/motors/${m.id}/compare?from=${before.id}&to=${after.id}`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const by = Object.fromEntries(res.body.data.quantities.map((q: { name: string }) => [q.name, q]));
    expect(Object.keys(by)).toEqual(expect.arrayContaining(['measuredKv', 'noLoadCurrentA', 'timingDeg', 'resistanceAt20COhm']));
    expect(by.timingDeg).toMatchObject({ from: 30, to: 38, delta: 8, tolerance: 3, verdict: 'clearly_outside' });
    expect(by.measuredKv.deltaPct).toBeCloseTo(((17_900 - 17_020) / 17_020) * 100, 6);
    expect(by.measuredKv.verdict).toBe('clearly_outside');
    expect(by.resistanceAt20COhm.verdict).toBe('clearly_within');
    expect(by.testVoltageV).toMatchObject({ delta: 0, verdict: 'clearly_within' });
    const codes = res.body.data.findings.map((f: { code: string }) => f.code);
    expect(codes).toEqual(expect.arrayContaining(['timing-moved', 'rotor-weaker']));
    // defaults: from the reference to the latest
    const dflt = await rosa.get(`/api/motors/${m.id}/compare`);
    expect([dflt.body.data.from.id, dflt.body.data.to.id]).toEqual([before.id, after.id]);
  });

  it("says can't tell when the repeats scatter as much as the tolerance", async () => {
    const m = await createMotor(rosa);
    const a = await addCheck(rosa, m.id, { timingDeg: undefined, readings: { timingDeg: [26, 30, 33] } });
    const b = await addCheck(rosa, m.id, { timingDeg: 30 });
    const res = await rosa.get(`/api/motors/${m.id}/compare?from=${a.id}&to=${b.id}`);
    expect(res.body.data.quantities.find((q: { name: string }) => q.name === 'timingDeg').verdict).toBe('cant_tell');
  });

  it('404 for a check of another motor, 409 with no checks, 400 for a bad id, 404 for another member', async () => {
    const m = await createMotor(rosa);
    expect((await rosa.get(`/api/motors/${m.id}/compare`)).body.error.code).toBe('no_checks');
    await addCheck(rosa, m.id);
    const other = await createMotor(rosa);
    const foreign = await addCheck(rosa, other.id);
    expect((await rosa.get(`/api/motors/${m.id}/compare?to=${foreign.id}`)).status).toBe(404);
    expectFieldError(await rosa.get(`/api/motors/${m.id}/compare?from=abc`), 'query.from');
    expect((await jonah.get(`/api/motors/${m.id}/compare`)).status).toBe(404);
  });
});

describe('GET /api/motors/:id/checks.csv', () => {
  it('downloads RFC 4180 CSV with formulas neutralised', async () => {
    const m = await createMotor(rosa, { label: '=HYPERLINK("x")' });
    await addCheck(rosa, m.id, { notes: '+cmd, "quoted"\nsecond line' });
    const res = await rosa.get(`/api/motors/${m.id}/checks.csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.text).toMatch(/\r\n$/);
    const rows = parse(res.text, { columns: true }) as Record<string, string>[]; // csv-parse: an independent RFC 4180 reader
    expect(rows).toHaveLength(1);
    expect(rows[0].motor).toBe(`'=HYPERLINK("x")`);
    expect(rows[0].notes).toBe(`'+cmd, "quoted"\nsecond line`);
    expect(Number(rows[0]['No-load speed (rpm)'])).toBe(17_020);
    expect(Number(rows[0]['measured kV (rpm/V)'])).toBeCloseTo(17_020 / 7.4, 6);
    expect((await jonah.get(`/api/motors/${m.id}/checks.csv`)).status).toBe(404);
  });
});

describe('DELETE /api/motors/:id/checks/:checkId', () => {
  it('deletes one check; the reference falls back to the first', async () => {
    const m = await createMotor(rosa);
    const a = await addCheck(rosa, m.id, { testedAt: '2026-11-01T10:00:00Z' });
    const b = await addCheck(rosa, m.id, { testedAt: '2026-11-02T10:00:00Z' });
    await rosa.patch(`/api/motors/${m.id}`, { referenceCheckId: b.id });
    expect((await jonah.delete(`/api/motors/${m.id}/checks/${b.id}`)).status).toBe(404);
    expect((await rosa.delete(`/api/motors/${m.id}/checks/${b.id}`)).status).toBe(204);
    expect((await rosa.get(`/api/motors/${m.id}`)).body.data.referenceCheckId).toBeNull();
    expect((await rosa.get(`/api/motors/${m.id}/checks`)).body.meta.referenceCheckId).toBe(a.id);
    expect((await rosa.delete(`/api/motors/${m.id}/checks/${b.id}`)).status).toBe(404);
  });
});
