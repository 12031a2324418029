import fs from 'node:fs';
import path from 'node:path';
import Ajv2020 from 'ajv/dist/2020';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedParameters } from '../../server/db/seed-content';
import { RUNLOG_FORMAT, RUNLOG_SCHEMA_VERSION } from '../../shared/runlog/vocabulary';
import { createClient, createTestApp, type TestApp, type TestClient } from '../setup/test-app';
import { signedInClient } from '../factories/user';
import { buildSetupRecord } from '../factories/setup-record';
import { buildRunCsv, sendRun, uploadRun } from '../factories/run';
import { createDraftGuide, proposeEdit } from '../factories/guide';
import { createMotor } from '../factories/motor';
import { evaluate } from 'mathjs';

let t: TestApp;
let rosa: TestClient;
let jonah: TestClient;

const runCount = async () => Number((await t.db.dataSource.query('SELECT count(*)::int AS n FROM runs'))[0].n);
function storedFiles(): string[] {
  const dir = path.join(t.ctx.config.uploadDir, 'runs');
  if (!fs.existsSync(dir)) return [];
  return fs
    .readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile())
    .map((e) => path.join(e.parentPath, e.name))
    .sort();
}
async function uploadSetup(client: TestClient, overrides = {}) {
  const token = (await client.agent.get('/api/csrf')).body.data.token as string;
  const res = await client.agent
    .post('/api/setups')
    .set('x-csrf-token', token)
    .attach('file', Buffer.from(JSON.stringify(buildSetupRecord(overrides))), { filename: 'setup.json', contentType: 'application/json' });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data.id as string;
}

beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  await seedParameters(t.db.dataSource);
  rosa = (await signedInClient(t, 'member')).client;
  jonah = (await signedInClient(t, 'member')).client;
});
afterAll(async () => {
  await t?.close();
});

describe('GET /schemas/runlog.v1.json', () => {
  it('serves a 2020-12 JSON Schema that validates a stored run (ajv)', async () => {
    const res = await createClient(t.app).get('/schemas/runlog.v1.json');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/application\/schema\+json/);
    const schema = JSON.parse(res.text);
    expect(schema.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
    const validate = new Ajv2020({ allErrors: true, strict: false, validateFormats: false }).compile(schema);
    const run = (await rosa.get(`/api/runs/${await uploadRun(rosa)}`)).body.data;
    const meta = {
      format: RUNLOG_FORMAT,
      schemaVersion: RUNLOG_SCHEMA_VERSION,
      title: run.title,
      sourceFile: { name: run.originalName, byteSize: run.byteSize },
      channels: run.channels,
      mapping: run.mapping,
      importNotes: run.importNotes,
      gaps: run.gaps,
      demo: run.demo,
      summary: run.summary,
    };
    expect(validate(meta), JSON.stringify(validate.errors)).toBe(true);
    expect(validate({ ...meta, format: 'something-else' })).toBe(false);
  });
});

describe('POST /api/runs', () => {
  it('401 for a visitor', async () => {
    const res = await (await sendRun(createClient(t.app))).req;
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('stores our own CSV: figures in PostgreSQL, the file and 4-byte columns in storage', async () => {
    const before = storedFiles().length;
    const res = await (await sendRun(rosa, { fields: { title: 'Heat 2, new pinion' } })).req;
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const run = res.body.data;
    expect(run.title).toBe('Heat 2, new pinion');
    expect(run.channels).toEqual(['time_s', 'throttle_pct', 'motor_rpm', 'motor_temp_c', 'esc_temp_c', 'current_a', 'pack_v']);
    for (const key of [
      'durationS',
      'sampleCount',
      'sampleRateHz',
      'peakRpm',
      'peakRpmAtS',
      'maxMotorTempC',
      'maxEscTempC',
      'peakCurrentA',
      'meanCurrentA',
      'minPackV',
      'restPackV',
      'energyMah',
      'energyWh',
      'fullThrottleShare',
    ]) {
      expect(typeof run.summary[key], key).toBe('number');
    }
    expect(run.summary.sampleCount).toBe(601); // 30 s at 20 Hz, both ends
    expect(run.summary.fullThrottleShare).toBeGreaterThan(0);
    expect(run.summary.fullThrottleShare).toBeLessThan(1);
    expect(storedFiles().length).toBe(before + 2);
    const [row] = await t.db.dataSource.query('SELECT data_bytes, raw_key, data_key FROM runs WHERE id = $1', [run.id]);
    expect(row.data_bytes / (run.summary.sampleCount * run.channels.length)).toBeLessThanOrEqual(4.02);
  });

  it('uses the proposed mapping for a foreign header and says so', async () => {
    const csv = 'Time [ms];Current [mA];Battery [V]\r\n0;1500;8,40\r\n100;25000;8,10\r\n200;25000;8,05\r\n';
    const res = await (await sendRun(rosa, { body: '\ufeff' + csv, name: 'logger export.csv' })).req;
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const codes = res.body.data.importNotes.map((n: { code: string }) => n.code);
    expect(codes).toEqual(expect.arrayContaining(['bom_removed', 'delimiter', 'decimal_comma', 'mapping_proposed', 'unit_converted']));
    expect(res.body.data.mapping.current_a).toEqual({ column: 'Current [mA]', unit: 'mA' });
    expect(res.body.data.summary.peakCurrentA).toBeCloseTo(25, 9);
  });

  it('takes a mapping the person confirmed (electrical rpm with the pole count)', async () => {
    const mapping = { time_s: { column: 'Zeit', unit: 's' }, motor_rpm: { column: 'ERPM', unit: 'erpm', poles: 4 } };
    const res = await (await sendRun(rosa, { body: 'Zeit,ERPM\n0,0\n1,60000\n2,50000\n', fields: { mapping: JSON.stringify(mapping) } })).req;
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.data.summary.peakRpm).toBe(30000); // 60,000 erpm on 4 poles = 30,000 rpm (electrical rpm = mechanical × pole pairs)
  });

  it('computes top speed and per-cell voltage through the attached setup', async () => {
    const setupId = await uploadSetup(rosa);
    const res = await (await sendRun(rosa, { fields: { setupId } })).req;
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.data.setupId).toBe(setupId);
    expect(res.body.data.summary.topSpeedKmh).toBeGreaterThan(0);
    expect(res.body.data.summary.minCellV).toBeCloseTo(res.body.data.summary.minPackV / 2, 9);
  });

  describe('refusals store nothing', () => {
    const huge = 'time_s,current_a\n' + '0,1\n'.repeat(9_000_000); // 36 MB: over the size limit
    const longRun = 'time_s\n' + Array.from({ length: 1_000_001 }, (_v, i) => String(i)).join('\n') + '\n';
    const cases: Array<
      [string, { body?: string | Buffer; name?: string; contentType?: string; fields?: Record<string, string> }, number, string, Record<string, unknown>?]
    > = [
      ['binary data with a .csv name', { body: Buffer.from([0x50, 0x4b, 3, 4, 0, 0, 0, 0, 1, 2, 3]) }, 400, 'invalid_run_log', { row: 1 }],
      [
        'a spreadsheet formula in a cell',
        { body: 'time_s,current_a\n0,1\n0.1,=HYPERLINK("http://x")\n' },
        400,
        'invalid_run_log',
        { row: 3, column: 'current_a' },
      ],
      ['NaN', { body: 'time_s,pack_v\n0,8.4\n0.1,NaN\n' }, 400, 'invalid_run_log', { row: 3, column: 'pack_v' }],
      ['Infinity', { body: 'time_s,pack_v\n0,8.4\n0.1,Infinity\n' }, 400, 'invalid_run_log', { row: 3, column: 'pack_v' }],
      ['negative time', { body: 'time_s,pack_v\n0,8.4\n-1,8.3\n' }, 400, 'invalid_run_log', { row: 3, column: 'time_s' }],
      ['a repeated time', { body: 'time_s,pack_v\n0,8.4\n0,8.3\n' }, 400, 'invalid_run_log', { row: 3, column: 'time_s' }],
      ['a word in a number column', { body: 'time_s,pack_v\n0,8.4\n0.1,8.3\n0.2,low\n' }, 400, 'invalid_run_log', { row: 4, column: 'pack_v' }],
      ['no time column', { body: 'volts,amps\n8.4,1\n8.3,2\n' }, 400, 'invalid_run_log', { row: 1 }],
      ['a JSON file renamed .csv', { body: '{"format":"tunewright.setup"}' }, 400, 'invalid_run_log', { row: 1 }],
      [
        'an unknown unit in the mapping',
        { body: 'a,b\n0,1\n1,2\n', fields: { mapping: JSON.stringify({ time_s: { column: 'a', unit: 'fortnights' } }) } },
        400,
        'validation_failed',
      ],
      ['a mapping that is not JSON', { body: 'a,b\n0,1\n1,2\n', fields: { mapping: '{time_s: a' } }, 400, 'validation_failed'],
      ['a setup that is not yours', { fields: { setupId: '00000000-0000-4000-8000-000000000000' } }, 400, 'validation_failed'],
      ['a .txt name', { name: 'run.txt' }, 415, 'invalid_run_log'],
      ['a million and one rows', { body: longRun }, 413, 'invalid_run_log', { code: undefined }],
      ['over the size limit (10 million rows)', { body: huge }, 413, 'invalid_run_log'],
    ];
    for (const [label, upload, status, code, detail] of cases) {
      it(`${label} → ${status} ${code}`, async () => {
        const [rows, files] = [await runCount(), storedFiles()];
        const res = await (await sendRun(rosa, upload)).req;
        expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(status);
        expect(Object.keys(res.body)).toEqual(['error']);
        expect(res.body.error.code).toBe(code);
        expect(res.body.error.message.length).toBeGreaterThan(0);
        if (detail) {
          const { code: _c, ...where } = detail;
          expect(res.body.error.details[0]).toMatchObject(where);
          if (where.row) expect(res.body.error.message).toContain(`row ${where.row}`);
        }
        expect(await runCount()).toBe(rows);
        expect(storedFiles()).toEqual(files);
      });
    }
  });
});

describe('POST /api/runs/preview', () => {
  it('proposes a mapping and shows the first rows, storing nothing', async () => {
    const [rows, files] = [await runCount(), storedFiles()];
    const csv = 'Time (s),Throttle (%),Motor Temp (°F),Amps\n' + Array.from({ length: 20 }, (_v, i) => `${i / 10},${i * 5},${100 + i},${i}`).join('\n');
    const res = await (await sendRun(rosa, { body: csv }, '/api/runs/preview')).req;
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.data.mapping).toEqual({
      time_s: { column: 'Time (s)', unit: 's' },
      throttle_pct: { column: 'Throttle (%)', unit: '%' },
      motor_temp_c: { column: 'Motor Temp (°F)', unit: 'F' },
      current_a: { column: 'Amps', unit: 'A' },
    });
    expect(res.body.data.rows.length).toBe(8);
    expect(res.body.data.rowCount).toBe(20);
    expect(res.body.data.problem).toBeNull();
    expect(res.body.data.summary.maxMotorTempC).toBeCloseTo((119 - 32) / 1.8, 9); // NIST SP 811, App. B: t/°C = (t/°F − 32)/1.8
    expect([await runCount(), storedFiles()]).toEqual([rows, files]);
  });

  it('reports the first problem with its row and column instead of failing the preview', async () => {
    const res = await (await sendRun(rosa, { body: 'time_s,pack_v\n0,8.4\n0.1,oops\n' }, '/api/runs/preview')).req;
    expect(res.status).toBe(200);
    expect(res.body.data.problem).toMatchObject({ code: 'not_a_number', row: 3, column: 'pack_v' });
  });
});

describe('GET /api/runs and GET /api/runs/:id', () => {
  it("lists only the caller's runs; another member gets the same 404 as for a missing id", async () => {
    const id = await uploadRun(rosa, { name: 'private.csv' });
    expect((await rosa.get('/api/runs')).body.data.some((r: { id: string }) => r.id === id)).toBe(true);
    expect((await jonah.get('/api/runs')).body.data.some((r: { id: string }) => r.id === id)).toBe(false);
    const stranger = await jonah.get(`/api/runs/${id}`);
    const missing = await jonah.get('/api/runs/00000000-0000-4000-8000-000000000000');
    expect(stranger.status).toBe(404);
    expect(stranger.body).toEqual(missing.body);
    expect((await createClient(t.app).get(`/api/runs/${id}`)).status).toBe(404);
  });
});

describe('GET /api/runs/:id/series', () => {
  it('returns at most N buckets and keeps the peak', async () => {
    const id = await uploadRun(rosa, { body: buildRunCsv({ durationS: 60, rateHz: 50 }) });
    const run = (await rosa.get(`/api/runs/${id}`)).body.data;
    const res = await rosa.get(`/api/runs/${id}/series?points=200`);
    expect(res.status).toBe(200);
    expect(res.body.data.t.length).toBeLessThanOrEqual(200);
    expect(res.body.data.sampleCount).toBe(run.summary.sampleCount);
    expect(Math.max(...res.body.data.channels.motor_rpm.max)).toBeCloseTo(run.summary.peakRpm, 0);
    expect(Math.max(...res.body.data.channels.current_a.max)).toBeCloseTo(run.summary.peakCurrentA, 4);
    expect((await rosa.get(`/api/runs/${id}/series?points=999999`)).status).toBe(400);
    expect((await jonah.get(`/api/runs/${id}/series`)).status).toBe(404);
  });
});

describe('GET /api/runs/compare', () => {
  it('aligns by cross-correlating the throttle traces and lists figures and settings that differ', async () => {
    const [s1, s2] = [
      await uploadSetup(rosa),
      await uploadSetup(rosa, { gearing: { spurTeeth: 84, pinionTeeth: 34, internalRatio: 2.6, tyreDiameterMm: 62 } }),
    ];
    const a = await uploadRun(rosa, { fields: { setupId: s1 }, body: buildRunCsv({ idleS: 2 }) });
    const b = await uploadRun(rosa, { fields: { setupId: s2 }, body: buildRunCsv({ idleS: 3.5, loadScale: 1.2, seed: 9 }) });
    const res = await rosa.get(`/api/runs/compare?a=${a}&b=${b}`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.data.alignment).toMatchObject({ method: 'cross-correlation', channel: 'throttle_pct' });
    expect(res.body.data.alignment.correlation).toBeGreaterThan(0.9);
    expect(Math.abs(res.body.data.alignment.offsetS - 1.5)).toBeLessThanOrEqual(0.1); // b idles 1.5 s longer before the same lap (within two samples at 20 Hz)
    // The first-full-throttle marks are still reported, and agree.
    expect(Math.abs(res.body.data.alignment.bAtS - res.body.data.alignment.aAtS - 1.5)).toBeLessThanOrEqual(0.1);
    const peak = res.body.data.differences.find((d: { key: string }) => d.key === 'peakCurrentA');
    expect(peak.delta).toBeCloseTo(peak.b - peak.a, 9);
    expect(res.body.data.settings).toEqual([expect.objectContaining({ path: 'gearing.pinionTeeth', a: 32, b: 34 })]);
    expect((await jonah.get(`/api/runs/compare?a=${a}&b=${b}`)).status).toBe(404);
  });

  /** Our CSV with some columns dropped, or the throttle held at one value. */
  function reshape(csv: string, opts: { keep: string[]; flatThrottle?: number }) {
    const [head, ...rows] = csv.trim().split('\n');
    const cols = head.split(',');
    const idx = opts.keep.map((k) => cols.indexOf(k));
    return [
      opts.keep.join(','),
      ...rows
        .map((r) => r.split(','))
        .map((c) => idx.map((i, j) => (opts.keep[j] === 'throttle_pct' && opts.flatThrottle !== undefined ? opts.flatThrottle : c[i])).join(',')),
    ].join('\n');
  }

  it('falls back to motor speed, then to the first full throttle, then to the starts, and says which it used', async () => {
    // No throttle in either run: the motor speed traces are matched instead.
    const noThrottle = ['time_s', 'motor_rpm', 'current_a'];
    const a = await uploadRun(rosa, { body: reshape(buildRunCsv({ idleS: 2 }), { keep: noThrottle }) });
    const b = await uploadRun(rosa, { body: reshape(buildRunCsv({ idleS: 4, seed: 3 }), { keep: noThrottle }) });
    const byRpm = (await rosa.get(`/api/runs/compare?a=${a}&b=${b}`)).body.data.alignment;
    expect(byRpm).toMatchObject({ method: 'cross-correlation', channel: 'motor_rpm' });
    expect(Math.abs(byRpm.offsetS - 2)).toBeLessThanOrEqual(0.1); // 2 s more idling (simulator input)

    // b's throttle never moves (held at 100 %): no correlation is defined, so the first sustained full throttle is used.
    const all = ['time_s', 'throttle_pct', 'current_a'];
    const c = await uploadRun(rosa, { body: reshape(buildRunCsv({ idleS: 2 }), { keep: all }) });
    const d = await uploadRun(rosa, { body: reshape(buildRunCsv({ idleS: 2 }), { keep: all, flatThrottle: 100 }) });
    const byMark = (await rosa.get(`/api/runs/compare?a=${c}&b=${d}`)).body.data.alignment;
    expect(byMark).toMatchObject({ method: 'full-throttle', channel: 'throttle_pct', correlation: null });
    expect(byMark.offsetS).toBeCloseTo(byMark.bAtS - byMark.aAtS, 9);
    expect(byMark.bAtS).toBe(0); // full from the first row

    // Only current in one run: nothing to match and no full throttle there, so the starts line up.
    const e = await uploadRun(rosa, { body: reshape(buildRunCsv({ idleS: 2 }), { keep: ['time_s', 'current_a'] }) });
    const byStart = (await rosa.get(`/api/runs/compare?a=${c}&b=${e}`)).body.data.alignment;
    expect(byStart).toMatchObject({ method: 'start', offsetS: 0, channel: null, bAtS: null });
  });
});

describe('evidence carried into a new draft', () => {
  it("a proposal starts with the live version's runs; taking one off is the proposal's change, not a silent loss", async () => {
    const moderator = (await signedInClient(t, 'moderator')).client;
    const { slug, revision } = await createDraftGuide(rosa);
    const [one, two] = [await uploadRun(rosa, { fields: { title: 'Heat 1' } }), await uploadRun(rosa, { fields: { title: 'Heat 2' } })];
    for (const id of [one, two]) expect((await rosa.put(`/api/revisions/${revision.id}/runs/${id}`)).status).toBe(200);
    expect((await rosa.post(`/api/revisions/${revision.id}/submit`, { note: 'With two heats' })).status).toBe(200);
    expect((await moderator.post(`/api/reviews/${revision.id}/publish`)).status).toBe(200);

    // Another member proposes an edit: the draft carries both runs, in the order they were offered.
    const draft = await proposeEdit(jonah, slug, { note: 'Tidier wording' });
    const carried = await jonah.get(`/api/revisions/${draft.id}/runs`);
    expect(carried.status).toBe(200);
    expect(carried.body.data.map((r: { id: string }) => r.id)).toEqual([one, two]);
    // They are still rosa's runs: public because the live version carries them, not editable by jonah.
    expect(carried.body.data.every((r: { isOwn: boolean }) => !r.isOwn)).toBe(true);
    expect((await jonah.patch(`/api/runs/${one}`, { title: 'Mine' })).status).toBe(404);
    // The proposal's author may take one off their own draft; the live version keeps it.
    expect((await jonah.delete(`/api/revisions/${draft.id}/runs/${two}`)).status).toBe(204);
    expect((await jonah.get(`/api/revisions/${draft.id}/runs`)).body.data.map((r: { id: string }) => r.id)).toEqual([one]);
    expect((await createClient(t.app).get(`/api/guides/${slug}/evidence`)).body.data.map((r: { id: string }) => r.id)).toEqual([one, two]);
  });
});

describe('PATCH /api/runs/:id', () => {
  it('attaches a run to one of your setups after upload (road speed and per-cell voltage appear), then detaches it', async () => {
    const id = await uploadRun(rosa);
    const before = (await rosa.get(`/api/runs/${id}`)).body.data;
    expect([before.setupId, before.gearing, before.summary.topSpeedKmh, before.summary.minCellV]).toEqual([null, null, null, null]);
    const setupId = await uploadSetup(rosa);
    const res = await rosa.patch(`/api/runs/${id}`, { setupId });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.data).toMatchObject({
      setupId,
      setupLabel: 'setup.json',
      gearing: { spurTeeth: 84, pinionTeeth: 32, internalRatio: 2.6, tyreDiameterMm: 62 },
    });
    const { peakRpm, topSpeedKmh, minCellV, minPackV } = res.body.data.summary;
    // mathjs evaluating the gear-train relation (Wikipedia "Gear train": spur/pinion × internal ratio; road speed = wheel rpm × π d)
    expect(topSpeedKmh).toBeCloseTo(evaluate(`${peakRpm} / (84 / 32 * 2.6) * pi * 62 mm / minute`).toNumber('km/h'), 6);
    expect(minCellV).toBeCloseTo(minPackV / 2, 9);
    // The same figures as uploading it attached in the first place.
    const direct = (await (await sendRun(rosa, { fields: { setupId } })).req).body.data.summary;
    expect(res.body.data.summary).toEqual(direct);
    expect((await rosa.get(`/api/runs/${id}`)).body.data.summary.topSpeedKmh).toBe(topSpeedKmh);

    const detached = await rosa.patch(`/api/runs/${id}`, { setupId: null, title: 'Heat 2, no setup' });
    expect(detached.status).toBe(200);
    expect(detached.body.data).toMatchObject({ setupId: null, gearing: null, title: 'Heat 2, no setup', summary: { topSpeedKmh: null, minCellV: null } });
  });

  it('names one of your registered motors, and clears it', async () => {
    const id = await uploadRun(rosa);
    const motor = await createMotor(rosa, { label: 'Club stock 17.5, rebuilt' });
    const res = await rosa.patch(`/api/runs/${id}`, { motorId: motor.id });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.data).toMatchObject({ motorId: motor.id, motorLabel: 'Club stock 17.5, rebuilt' });
    expect((await rosa.get('/api/runs')).body.data.find((r: { id: string }) => r.id === id)).toMatchObject({ motorLabel: 'Club stock 17.5, rebuilt' });
    // Deleting the motor clears the link (the run stays).
    expect((await rosa.delete(`/api/motors/${motor.id}`)).status).toBe(204);
    expect((await rosa.get(`/api/runs/${id}`)).body.data).toMatchObject({ motorId: null, motorLabel: null });
    // On upload too.
    const other = await createMotor(rosa);
    const uploaded = await (await sendRun(rosa, { fields: { motorId: other.id } })).req;
    expect(uploaded.status, JSON.stringify(uploaded.body)).toBe(201);
    expect(uploaded.body.data.motorId).toBe(other.id);
    expect((await rosa.patch(`/api/runs/${uploaded.body.data.id}`, { motorId: null })).body.data.motorId).toBeNull();
  });

  it("another member's run, setup or motor is answered 404 exactly like a missing one, and changes nothing", async () => {
    const id = await uploadRun(rosa);
    const rosaSetup = await uploadSetup(rosa);
    const jonahSetup = await uploadSetup(jonah);
    const jonahMotor = await createMotor(jonah);
    const snapshot = async () => (await rosa.get(`/api/runs/${id}`)).body;
    const before = await snapshot();
    const missing = await rosa.patch(`/api/runs/${id}`, { setupId: '00000000-0000-4000-8000-000000000000' });
    expect(missing.status).toBe(404);
    const theirs = await rosa.patch(`/api/runs/${id}`, { setupId: jonahSetup });
    expect(theirs.status).toBe(404);
    expect(theirs.body).toEqual(missing.body);
    const theirMotor = await rosa.patch(`/api/runs/${id}`, { motorId: jonahMotor.id, title: 'Should not stick' });
    expect(theirMotor.status).toBe(404);
    expect(theirMotor.body.error.code).toBe('not_found');
    expect((await jonah.patch(`/api/runs/${id}`, { setupId: jonahSetup })).status).toBe(404);
    expect((await jonah.patch(`/api/runs/${id}`, { title: 'Mine now' })).status).toBe(404);
    expect((await createClient(t.app).patch(`/api/runs/${id}`, { setupId: rosaSetup })).status).toBe(401);
    expect(await snapshot()).toEqual(before);
  });

  it('refuses an empty or malformed change with the error shape', async () => {
    const id = await uploadRun(rosa);
    for (const [body, path] of [
      [{}, 'body'],
      [{ setupId: 'blue-can' }, 'body.setupId'],
      [{ motorId: 42 }, 'body.motorId'],
      [{ title: '   ' }, 'body.title'],
      [{ ownerId: '00000000-0000-4000-8000-000000000000' }, 'body'],
    ] as const) {
      const res = await rosa.patch(`/api/runs/${id}`, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.details.map((d: { path: string }) => d.path)).toContain(path);
    }
  });
});

describe('DELETE /api/runs/:id', () => {
  it('removes the row and both stored objects; others get 404', async () => {
    const id = await uploadRun(rosa);
    const files = storedFiles().length;
    expect((await jonah.delete(`/api/runs/${id}`)).status).toBe(404);
    expect((await rosa.delete(`/api/runs/${id}`)).status).toBe(204);
    expect((await rosa.get(`/api/runs/${id}`)).status).toBe(404);
    expect(storedFiles().length).toBe(files - 2);
  });
});

describe('PUT /api/revisions/:id/runs/:runId and GET /api/guides/:slug/evidence', () => {
  it('a run offered on a draft stays private, the moderator sees its figures in review, and it is public once live', async () => {
    const moderator = (await signedInClient(t, 'moderator')).client;
    const { slug, revision } = await createDraftGuide(rosa);
    const runId = await uploadRun(rosa, { fields: { title: 'Evidence: heat 3' } });
    const attached = await rosa.put(`/api/revisions/${revision.id}/runs/${runId}`);
    expect(attached.status, JSON.stringify(attached.body)).toBe(200);
    expect(attached.body.data.map((r: { id: string }) => r.id)).toEqual([runId]);
    // Someone else's run cannot be offered on your draft; nobody else can change your draft's evidence.
    const jonahsRun = await uploadRun(jonah);
    expect((await rosa.put(`/api/revisions/${revision.id}/runs/${jonahsRun}`)).status).toBe(404);
    expect((await jonah.put(`/api/revisions/${revision.id}/runs/${jonahsRun}`)).status).toBe(404);
    // Private while a draft and while in review.
    expect((await createClient(t.app).get(`/api/runs/${runId}`)).status).toBe(404);
    expect((await rosa.post(`/api/revisions/${revision.id}/submit`, { note: 'With a logged run' })).status).toBe(200);
    expect((await jonah.get(`/api/runs/${runId}`)).status).toBe(404);
    expect((await jonah.get(`/api/revisions/${revision.id}/runs`)).status).toBe(404);
    const review = await moderator.get(`/api/revisions/${revision.id}/runs`);
    expect(review.status).toBe(200);
    expect(review.body.data[0].summary.peakRpm).toBeGreaterThan(0);
    // Reviewed evidence cannot be pulled out from under the review.
    expect((await rosa.delete(`/api/runs/${runId}`)).status).toBe(409);
    expect((await moderator.post(`/api/reviews/${revision.id}/publish`)).status).toBe(200);
    const visitor = createClient(t.app);
    const evidence = await visitor.get(`/api/guides/${slug}/evidence`);
    expect(evidence.status).toBe(200);
    expect(evidence.body.data).toEqual([expect.objectContaining({ id: runId, title: 'Evidence: heat 3', isOwn: false, setupId: null })]);
    expect((await visitor.get(`/api/runs/${runId}`)).status).toBe(200);
    expect((await visitor.get(`/api/runs/${runId}/series?points=50`)).status).toBe(200);
    expect((await visitor.delete(`/api/runs/${runId}`)).status).toBe(401);
    expect((await jonah.delete(`/api/runs/${runId}`)).status).toBe(404);
  });
});
