import fs from 'node:fs';
import path from 'node:path';
import Ajv2020 from 'ajv/dist/2020';
import { parse } from 'csv-parse/sync';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seed } from '../../server/db/seed';
import { DocumentEntity } from '../../server/modules/revisions/document.entity';
import { RevisionEntity } from '../../server/modules/revisions/revision.entity';
import type { SetupRecord } from '../../shared/schemas/setup-record';
import { computeSetup } from '../../shared/setup/computed';
import { computeGearing } from '../../shared/calc/gearing';
import { computePack } from '../../shared/calc/pack';
import { createClient, createTestApp, type TestApp, type TestClient } from '../setup/test-app';
import { signedInClient } from '../factories/user';
import { buildSetupRecord } from '../factories/setup-record';

let t: TestApp;
const GUIDE = 'stock-2wd-buggy-harbour-flats-clay';

function listFiles(dir: string): string[] {
  if (!fs.existsSync(dir)) return [];
  return fs
    .readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile())
    .map((e) => path.join(e.parentPath, e.name))
    .sort();
}
const setupCount = async () => Number((await t.db.dataSource.query('SELECT count(*)::int AS n FROM setups'))[0].n);

type Upload = { name: string; body: Buffer | string; contentType?: string };
/** A multipart POST on the client's session (the client helper only sends JSON). */
// Wrapped in an object: a supertest request is thenable, so returning it bare from an async function would send it.
async function multipart(client: TestClient) {
  const token = (await client.agent.get('/api/csrf')).body.data.token as string;
  return { req: client.agent.post('/api/setups').set('x-csrf-token', token) };
}
const upload = async (client: TestClient, file: Upload) =>
  // form-data keeps a path in the name only when it comes as `filepath` (superagent passes the options through; its types omit it).
  (await multipart(client)).req.attach('file', typeof file.body === 'string' ? Buffer.from(file.body) : file.body, {
    filename: file.name,
    filepath: file.name,
    contentType: file.contentType ?? (file.name.endsWith('.csv') ? 'text/csv' : 'application/json'),
  } as { filename: string; contentType: string });

beforeAll(async () => {
  t = await createTestApp();
  await seed(t.db.dataSource, { demo: true, bcryptCost: 4 });
});
afterAll(async () => {
  await t?.close();
});

describe('GET /schemas/setup-record.v1.json', () => {
  it('serves a 2020-12 JSON Schema that validates an exported baseline (ajv)', async () => {
    const res = await createClient(t.app).get('/schemas/setup-record.v1.json');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/schema\+json/);
    const schema = JSON.parse(res.text);
    expect(schema.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
    const validate = new Ajv2020({ allErrors: true, strict: false, validateFormats: false }).compile(schema);
    const exported = JSON.parse((await createClient(t.app).get(`/api/guides/${GUIDE}/setup.json`)).text);
    expect(validate(exported), JSON.stringify(validate.errors)).toBe(true);
    expect(validate({ ...exported, schemaVersion: 2 })).toBe(false);
  });
});

describe('GET /schemas/setup-record.v2.json', () => {
  it('serves version 2: a registered motor may be named, and version 1 stays published beside it', async () => {
    const res = await createClient(t.app).get('/schemas/setup-record.v2.json');
    expect(res.status).toBe(200);
    const validate = new Ajv2020({ allErrors: true, strict: false, validateFormats: false }).compile(JSON.parse(res.text));
    const exported = JSON.parse((await createClient(t.app).get(`/api/guides/${GUIDE}/setup.json`)).text);
    const v2 = { ...exported, schemaVersion: 2, motor: { ...exported.motor, registeredMotorId: '3f0c9a52-8d0e-4a51-9a51-2a7f0e0d1c11' } };
    expect(validate(v2), JSON.stringify(validate.errors)).toBe(true);
    expect(validate({ ...v2, schemaVersion: 1 })).toBe(false);
  });
});

describe('POST /api/setups naming a registered motor', () => {
  it("accepts the uploader's own motor and refuses anyone else's exactly like a missing one", async () => {
    const { client: owner } = await signedInClient(t);
    const { client: other } = await signedInClient(t);
    const motor = (await owner.post('/api/motors', { label: 'Blue can', poles: 2, sensored: true })).body.data as { id: string };
    const record = (id: string) => JSON.stringify({ ...buildSetupRecord(), schemaVersion: 2, motor: { ...buildSetupRecord().motor, registeredMotorId: id } });
    const mine = await upload(owner, { name: 'mine.json', body: record(motor.id) });
    expect(mine.status, JSON.stringify(mine.body)).toBe(201);
    expect(mine.body.data.record.motor.registeredMotorId).toBe(motor.id);
    const theirs = await upload(other, { name: 'theirs.json', body: record(motor.id) });
    const missing = await upload(other, { name: 'theirs.json', body: record('00000000-0000-4000-8000-000000000000') });
    expect(theirs.status).toBe(400);
    expect(theirs.body).toEqual(missing.body);
    expect(theirs.body.error.details).toEqual([{ path: 'motor.registeredMotorId', message: 'That is not a motor in your motor register' }]);
  });
});

describe('GET /api/guides/:slug/setup', () => {
  it("returns the live revision's baseline with provenance and computed values", async () => {
    const res = await createClient(t.app).get(`/api/guides/${GUIDE}/setup`);
    expect(res.status).toBe(200);
    const record: SetupRecord = res.body.data;
    expect(record.format).toBe('tunewright.setup');
    expect(record.gearing.pinionTeeth).toBe(32); // v3 is live (v4 is in review)
    expect(record.provenance).toMatchObject({ guideSlug: GUIDE, revisionNumber: 3, authorDisplayName: 'Rosa Kittering' });
    expect(res.body.meta.computed.gearing.finalDriveRatio).toBe(computeSetup(record).gearing!.finalDriveRatio);
  });

  it('404s for a guide that does not exist', async () => {
    const res = await createClient(t.app).get('/api/guides/no-such-guide/setup');
    expect(res.status).toBe(404);
  });
});

describe('GET /api/guides/:slug/setup.json and setup.csv', () => {
  it('downloads JSON as <slug>-v<n>.tunewright.json with an RFC 6266 Content-Disposition', async () => {
    const res = await createClient(t.app).get(`/api/guides/${GUIDE}/setup.json`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/json/);
    expect(res.headers['content-disposition']).toBe(`attachment; filename="${GUIDE}-v3.tunewright.json"; filename*=UTF-8''${GUIDE}-v3.tunewright.json`);
  });

  it('downloads CSV that csv-parse reads to the same values as the JSON', async () => {
    const client = createClient(t.app);
    const json: SetupRecord = JSON.parse((await client.get(`/api/guides/${GUIDE}/setup.json`)).text);
    const res = await client.get(`/api/guides/${GUIDE}/setup.csv`);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toContain(`filename="${GUIDE}-v3.tunewright.csv"`);
    const rows: { path: string; value: string; unit: string; source: string }[] = parse(res.text, { columns: true });
    const value = (p: string) => rows.find((r) => r.path === p)?.value;
    expect(value('gearing.spurTeeth')).toBe(String(json.gearing.spurTeeth));
    expect(value('gearing.pinionTeeth')).toBe(String(json.gearing.pinionTeeth));
    expect(value('escSettings.drag-brake')).toBe(String(json.escSettings['drag-brake'].value));
    expect(rows.find((r) => r.path === 'escSettings.drag-brake')?.unit).toBe('%');
    expect(value('provenance.guideSlug')).toBe(GUIDE);
    const gearing = computeGearing({ spur: 84, pinion: 32, internalRatio: 2.6, tyreDiameterMm: 62 }).results;
    expect(rows.find((r) => r.path === 'computed.finalDriveRatio')).toMatchObject({ value: String(gearing.finalDriveRatio), source: 'computed' });
    expect(Number(value('computed.pack.cutoffV'))).toBe(computePack({ chemistry: 'lipo', cells: 2, cutoffPerCellV: 3.2 }).results.cutoffV);
    expect(rows.some((r) => r.path.startsWith('computed.cautions.') && r.source === 'computed')).toBe(true);
  });
});

describe('POST /api/setups round trip', () => {
  it('export JSON → import gives the same record', async () => {
    const { client } = await signedInClient(t);
    const exported = (await client.get(`/api/guides/${GUIDE}/setup.json`)).text;
    const res = await upload(client, { name: `${GUIDE}-v3.tunewright.json`, body: exported });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.data.record).toEqual(JSON.parse(exported));
  });

  it('export CSV → import gives the same record', async () => {
    const { client } = await signedInClient(t);
    const csv = (await client.get(`/api/guides/${GUIDE}/setup.csv`)).text;
    const json: SetupRecord = JSON.parse((await client.get(`/api/guides/${GUIDE}/setup.json`)).text);
    const res = await upload(client, { name: 'baseline.csv', body: csv });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const imported: SetupRecord = res.body.data.record;
    // The two downloads were made at different moments; everything else must match exactly.
    expect({ ...imported, provenance: { ...imported.provenance, exportedAt: 'x' } }).toEqual({ ...json, provenance: { ...json.provenance, exportedAt: 'x' } });
  });
});

describe('POST /api/setups refuses bad uploads and stores nothing', () => {
  const good = JSON.stringify(buildSetupRecord());
  const withRecord = (patch: (r: SetupRecord) => unknown) => JSON.stringify(patch(buildSetupRecord()));
  const corpus: { why: string; file: Upload; status: number; path: string; message?: RegExp }[] = [
    { why: 'wrong extension', file: { name: 'setup.txt', body: good, contentType: 'text/plain' }, status: 415, path: 'file.name', message: /\.json.*\.csv/ },
    { why: 'wrong content type', file: { name: 'setup.json', body: good, contentType: 'image/png' }, status: 415, path: 'file.type' },
    {
      why: 'binary bytes',
      file: { name: 'setup.json', body: Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]) },
      status: 415,
      path: 'file',
      message: /binary/,
    },
    { why: 'not UTF-8', file: { name: 'setup.json', body: Buffer.from([0x7b, 0xff, 0xfe, 0x7d]) }, status: 415, path: 'file', message: /UTF-8/ },
    {
      why: 'bad JSON',
      file: { name: 'setup.json', body: '{"format": "tunewright.setup", "schemaVersion": 1,' },
      status: 400,
      path: '(file)',
      message: /Not valid JSON/,
    },
    {
      why: 'schema version 3',
      file: { name: 'setup.json', body: withRecord((r) => ({ ...r, schemaVersion: 3 })) },
      status: 400,
      path: 'schemaVersion',
      message: /version 3/,
    },
    {
      why: 'unknown slug',
      file: { name: 'setup.json', body: withRecord((r) => ({ ...r, escSettings: { 'drag-brak': { value: 8, unit: '%' } } })) },
      status: 400,
      path: 'escSettings.drag-brak',
      message: /Did you mean "drag-brake"/,
    },
    {
      why: 'out-of-range value',
      file: { name: 'setup.json', body: withRecord((r) => ({ ...r, escSettings: { 'drag-brake': { value: 140, unit: '%' } } })) },
      status: 400,
      path: 'escSettings.drag-brake.value',
      message: /between 0 % and 100 %/,
    },
    { why: '300 KB file', file: { name: 'setup.json', body: good + ' '.repeat(300 * 1024) }, status: 413, path: 'file', message: /256 KB/ },
    { why: 'path-traversal name', file: { name: '../../etc/passwd.json', body: good }, status: 400, path: 'file.name', message: /folder path/ },
    { why: 'odd bytes in the name', file: { name: 'setup\u202enosj.json', body: good }, status: 400, path: 'file.name', message: /invisible/ },
    // busboy itself refuses a raw control character in a part header, before the name reaches our checks.
    { why: 'a control character in the name', file: { name: 'set\u0007up.json', body: good }, status: 400, path: 'file', message: /header/ },
    { why: 'a CSV in another layout', file: { name: 'setup.csv', body: 'name,pinion\r\nmine,32\r\n' }, status: 415, path: '(file)', message: /layout/ },
    {
      why: 'a CSV with an unreadable row',
      file: {
        name: 'setup.csv',
        body: 'path,value,unit,source\r\nformat,tunewright.setup,,record\r\nschemaVersion,1,,record\r\ngearing.spurTeeth,eighty,teeth,record\r\n',
      },
      status: 400,
      path: 'gearing.spurTeeth',
      message: /must be a number/,
    },
  ];

  for (const c of corpus) {
    it(`${c.why} → ${c.status}`, async () => {
      const { client } = await signedInClient(t);
      const [rowsBefore, filesBefore] = [await setupCount(), listFiles(t.ctx.config.uploadDir)];
      const res = await upload(client, c.file);
      expect(res.status, JSON.stringify(res.body)).toBe(c.status);
      expect(res.body.error.code).toBe('invalid_setup');
      const detail = (res.body.error.details as { path: string; message: string }[]).find((d) => d.path === c.path);
      expect(detail, JSON.stringify(res.body.error.details)).toBeDefined();
      if (c.message) expect(detail!.message).toMatch(c.message);
      expect(await setupCount()).toBe(rowsBefore);
      expect(listFiles(t.ctx.config.uploadDir)).toEqual(filesBefore);
    });
  }

  it('lists every problem of a record at once', async () => {
    const { client } = await signedInClient(t);
    const body = withRecord((r) => ({
      ...r,
      gearing: { ...r.gearing, pinionTeeth: 2 },
      escSettings: { nonsense: { value: 1, unit: '' } },
      battery: { chemistry: 'lead', cells: 2 },
    }));
    const res = await upload(client, { name: 'setup.json', body });
    expect(res.status).toBe(400);
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toEqual(
      expect.arrayContaining(['gearing.pinionTeeth', 'escSettings.nonsense', 'battery.chemistry']),
    );
  });

  it('refuses a request with no file', async () => {
    const { client } = await signedInClient(t);
    const res = await (await multipart(client)).req.field('note', 'no file here');
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'invalid_setup', details: [{ path: 'file' }] });
  });

  it('401 for visitors, and nothing is stored', async () => {
    const before = await setupCount();
    const res = await upload(createClient(t.app), { name: 'setup.json', body: good });
    expect(res.status).toBe(401);
    expect(await setupCount()).toBe(before);
  });

  it('removes the stored object again when the row cannot be written', async () => {
    const { client, user } = await signedInClient(t);
    const filesBefore = listFiles(t.ctx.config.uploadDir);
    // A constraint that refuses this owner's rows makes the insert fail after the object was written.
    await t.db.dataSource.query(`ALTER TABLE setups ADD CONSTRAINT setups_test_block CHECK (owner_id <> '${user.id}') NOT VALID`);
    try {
      const res = await upload(client, { name: 'setup.json', body: good });
      expect(res.status).toBe(500);
    } finally {
      await t.db.dataSource.query('ALTER TABLE setups DROP CONSTRAINT setups_test_block');
    }
    expect(listFiles(t.ctx.config.uploadDir)).toEqual(filesBefore);
  });
});

describe('GET /api/setups/:id, download and DELETE', () => {
  it('is readable by its owner only; others get 404, visitors 401', async () => {
    const { client } = await signedInClient(t);
    const body = JSON.stringify(buildSetupRecord(), null, 2);
    const created = await upload(client, { name: 'My café setup.json', body });
    expect(created.status).toBe(201);
    const id = created.body.data.id as string;
    expect(created.body.data.originalName).toBe('My café setup.json');

    const row = (await t.db.dataSource.query('SELECT storage_key FROM setups WHERE id = $1', [id]))[0];
    expect(row.storage_key).toMatch(/^setups\/\d{4}\/\d{2}\/[0-9a-f-]{36}\.json$/);
    expect(fs.readFileSync(path.join(t.ctx.config.uploadDir, row.storage_key), 'utf8')).toBe(body);

    expect((await client.get(`/api/setups/${id}`)).status).toBe(200);
    const { client: other } = await signedInClient(t);
    expect((await other.get(`/api/setups/${id}`)).status).toBe(404);
    expect((await other.get(`/api/setups/${id}/download`)).status).toBe(404);
    expect((await other.delete(`/api/setups/${id}`)).status).toBe(404);
    expect((await createClient(t.app).get(`/api/setups/${id}`)).status).toBe(401);

    const dl = await client.get(`/api/setups/${id}/download`);
    expect(dl.status).toBe(200);
    expect(dl.headers['content-type']).toMatch(/^application\/json/);
    expect(dl.headers['content-disposition']).toBe(`attachment; filename="My caf_ setup.json"; filename*=UTF-8''My%20caf%C3%A9%20setup.json`);
    expect(dl.text).toBe(body);

    expect((await client.delete(`/api/setups/${id}`)).status).toBe(204);
    expect((await client.get(`/api/setups/${id}`)).status).toBe(404);
    expect(fs.existsSync(path.join(t.ctx.config.uploadDir, row.storage_key))).toBe(false);
  });
});

describe('GET /api/setups', () => {
  it("lists published guides' baselines for visitors, with no uploads", async () => {
    const res = await createClient(t.app).get('/api/setups');
    expect(res.status).toBe(200);
    expect(res.body.data.uploads).toEqual([]);
    const published = Number(
      (await t.db.dataSource.query("SELECT count(*)::int AS n FROM documents WHERE kind = 'guide' AND published_revision_id IS NOT NULL"))[0].n,
    );
    expect(res.body.data.baselines).toHaveLength(published);
    const stock = res.body.data.baselines.find((b: { guideSlug: string }) => b.guideSlug === GUIDE);
    expect(stock).toMatchObject({ revisionNumber: 3, summary: { class: 'buggy-2wd-stock', surface: 'clay', finalDriveRatio: 6.825 } });
  });

  it("lists a member's own uploads and nobody else's", async () => {
    const { client } = await signedInClient(t);
    await upload(client, { name: 'mine.json', body: JSON.stringify(buildSetupRecord()) });
    const res = await client.get('/api/setups');
    expect(res.body.data.uploads.map((u: { originalName: string }) => u.originalName)).toEqual(['mine.json']);
  });
});

describe('GET /api/setups/compare', () => {
  it("compares a guide's baseline with an upload: differences, deltas equal to the calculators, cautions", async () => {
    const { client } = await signedInClient(t);
    const base: SetupRecord = JSON.parse((await client.get(`/api/guides/${GUIDE}/setup.json`)).text);
    const mine = {
      ...base,
      gearing: { ...base.gearing, pinionTeeth: 34 },
      escSettings: { ...base.escSettings, 'low-voltage-cutoff': { value: 2.9, unit: 'V' } },
    };
    const id = (await upload(client, { name: 'mine.json', body: JSON.stringify(mine) })).body.data.id;
    const res = await client.get(`/api/setups/compare?a=guide:${GUIDE}&b=${id}&rpm=25000`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const data = res.body.data;
    expect(data.a).toMatchObject({ kind: 'guide', ref: `guide:${GUIDE}` });
    expect(data.differences.map((d: { path: string }) => d.path)).toEqual(['escSettings.low-voltage-cutoff', 'gearing.pinionTeeth']);
    const fdr = data.deltas.find((d: { key: string }) => d.key === 'finalDriveRatio');
    expect(fdr.b).toBe(computeGearing({ spur: 84, pinion: 34, internalRatio: 2.6, tyreDiameterMm: 62 }).results.finalDriveRatio);
    expect(data.deltas.find((d: { key: string }) => d.key === 'cutoffV').b).toBe(
      computePack({ chemistry: 'lipo', cells: 2, cutoffPerCellV: 2.9 }).results.cutoffV,
    );
    expect(data.atRpm).toBe(25000);
    expect(data.cautions[0]).toMatchObject({ side: 'b', level: 'danger', code: 'cutoff-below-window' });
  });

  it("does not show someone else's upload, and checks the refs", async () => {
    const { client } = await signedInClient(t);
    const id = (await upload(client, { name: 'mine.json', body: JSON.stringify(buildSetupRecord()) })).body.data.id;
    expect((await createClient(t.app).get(`/api/setups/compare?a=guide:${GUIDE}&b=${id}`)).status).toBe(404);
    const bad = await createClient(t.app).get(`/api/setups/compare?a=guide:${GUIDE}&b=../etc`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('query.b');
    expect((await createClient(t.app).get(`/api/setups/compare?a=guide:${GUIDE}&b=guide:mod-4wd-buggy-harbour-flats-clay`)).status).toBe(200);
  });

  it('reads refs in any case the same way (prefix, slug and upload id), never a server error', async () => {
    const { client } = await signedInClient(t);
    const id: string = (await upload(client, { name: 'mine.json', body: JSON.stringify(buildSetupRecord()) })).body.data.id;
    const plain = await client.get(`/api/setups/compare?a=guide:${GUIDE}&b=${id}`);
    expect(plain.status).toBe(200);
    for (const [a, b] of [
      [`GUIDE:${GUIDE}`, id],
      [`Guide:${GUIDE.toUpperCase()}`, id.toUpperCase()],
    ]) {
      const res = await client.get(`/api/setups/compare?a=${encodeURIComponent(a)}&b=${encodeURIComponent(b)}`);
      expect(res.status, `${a} / ${b}: ${res.text.slice(0, 200)}`).toBe(200);
      expect(res.body.data.differences).toEqual(plain.body.data.differences);
      expect(res.body.data.a.ref).toBe(`guide:${GUIDE}`);
    }
    // An unknown guide in capitals is as unknown as in lower case.
    const unknown = await client.get('/api/setups/compare?a=GUIDE:no-such-guide&b=guide:no-such-guide');
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.code).toBeDefined();
  });
});

describe('PUT and DELETE /api/revisions/:id/setup', () => {
  async function draftFor(authorId: string, state: 'draft' | 'in_review' = 'draft') {
    const ds = t.db.dataSource;
    const doc = await ds
      .getRepository(DocumentEntity)
      .save(ds.getRepository(DocumentEntity).create({ kind: 'guide', slug: `draft-${Math.random().toString(36).slice(2, 10)}`, createdBy: authorId }));
    return ds
      .getRepository(RevisionEntity)
      .save(ds.getRepository(RevisionEntity).create({ documentId: doc.id, number: 1, authorId, state, note: '', content: { title: 'A draft guide' } }));
  }

  it("attaches and removes the baseline of the author's own draft", async () => {
    const { client, user } = await signedInClient(t);
    const rev = await draftFor(user.id);
    const record = { ...buildSetupRecord(), provenance: { guideSlug: 'somewhere-else' } };
    const res = await client.put(`/api/revisions/${rev.id}/setup`, record);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const stored = (await t.db.dataSource.getRepository(RevisionEntity).findOneByOrFail({ id: rev.id })).setup;
    expect(stored).toEqual(buildSetupRecord());
    expect((await client.delete(`/api/revisions/${rev.id}/setup`)).status).toBe(204);
    expect((await t.db.dataSource.getRepository(RevisionEntity).findOneByOrFail({ id: rev.id })).setup).toBeNull();
  });

  it('refuses an invalid record with every problem listed', async () => {
    const { client, user } = await signedInClient(t);
    const rev = await draftFor(user.id);
    const res = await client.put(`/api/revisions/${rev.id}/setup`, { ...buildSetupRecord(), escSettings: { 'drag-brake': { value: 8, unit: 'deg' } } });
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'invalid_setup', details: [{ path: 'escSettings.drag-brake.unit' }] });
  });

  it("404 for another member (someone else's draft is not there for them), 409 once the revision left draft, 401 for visitors, 404 for no revision", async () => {
    const { user } = await signedInClient(t);
    const rev = await draftFor(user.id);
    const { client: other } = await signedInClient(t);
    const refused = await other.put(`/api/revisions/${rev.id}/setup`, buildSetupRecord());
    expect(refused.status).toBe(404);
    expect(refused.body.error.code).toBe('not_found');
    const { client: author, user: a2 } = await signedInClient(t);
    const submitted = await draftFor(a2.id, 'in_review');
    const res = await author.put(`/api/revisions/${submitted.id}/setup`, buildSetupRecord());
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('not_draft');
    expect((await createClient(t.app).put(`/api/revisions/${rev.id}/setup`, buildSetupRecord())).status).toBe(401);
    expect((await author.put('/api/revisions/00000000-0000-4000-8000-000000000000/setup', buildSetupRecord())).status).toBe(404);
  });
});
