import { strFromU8, unzipSync } from 'fflate';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FORMER_MEMBER_NAME } from '../../shared/schemas/account';
import { UserEntity } from '../../server/modules/auth/user.entity';
import { seedParameters } from '../../server/db/seed-content';
import { createClient, createTestApp, type TestApp, type TestClient } from '../setup/test-app';
import { createUser, signedInClient, STRONG_PASSWORD } from '../factories/user';
import { createDraftGuide, createPublishedGuide, proposeEdit } from '../factories/guide';
import { addCheck, createMotor } from '../factories/motor';
import { buildRunCsv, uploadRun } from '../factories/run';
import { buildSetupRecord } from '../factories/setup-record';

let t: TestApp;
let moderator: TestClient;

beforeAll(async () => {
  t = await createTestApp();
  // Setup records are checked against the parameter library.
  await seedParameters(t.db.dataSource);
  moderator = (await signedInClient(t, 'moderator')).client;
});
afterAll(async () => {
  await t?.close();
});

/** A multipart setup upload on the client's session (the client helper only sends JSON). */
async function uploadSetup(client: TestClient, name: string, body: string) {
  const token = (await client.agent.get('/api/csrf')).body.data.token as string;
  const res = await client.agent
    .post('/api/setups')
    .set('x-csrf-token', token)
    .attach('file', Buffer.from(body), { filename: name, contentType: 'application/json' });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data.id as string;
}

/** The export as raw bytes, unzipped (fflate is an independent zip reader). */
async function exportOf(client: TestClient) {
  const res = await client.agent
    .get('/api/account/export')
    .buffer(true)
    .parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
  return { res, files: res.status === 200 ? unzipSync(new Uint8Array(res.body as Buffer)) : {} };
}

const text = (files: Record<string, Uint8Array>, name: string) => {
  const f = files[`tunewright-data/${name}`];
  if (!f) throw new Error(`${name} is not in the archive: ${Object.keys(files).join(', ')}`);
  return strFromU8(f);
};

/** A member with something of every kind: a published guide, an edit of it, a never-live draft, a setup, a run, a motor with a check, a watch. */
async function busyMember() {
  const password = `harbour-${Math.random().toString(36).slice(2, 8)}-lantern-spur`;
  const { user } = await createUser(t, { password });
  const client = createClient(t.app);
  expect((await client.post('/api/auth/sign-in', { email: user.email, password })).status).toBe(200);
  client.resetCsrf();
  const published = await createPublishedGuide(client, moderator, { title: `Published by a leaver ${user.id.slice(0, 6)}` });
  const edit = await proposeEdit(client, published.slug, { summary: 'An edit still on the workbench when the account goes, about the hairpin.' });
  const draft = await createDraftGuide(client, { title: `Never live ${user.id.slice(0, 6)}` });
  const setupBody = JSON.stringify(buildSetupRecord({ notes: 'Leaver setup notes' }));
  const setupId = await uploadSetup(client, 'leaver-setup.json', setupBody);
  const runCsv = buildRunCsv({ seed: 11 });
  const runId = await uploadRun(client, { name: 'leaver-run.csv', body: runCsv });
  const motor = await createMotor(client, { label: 'Leaver spare 13.5' });
  await addCheck(client, motor.id);
  return { user, password, client, published, edit, draft, setupId, setupBody, runId, runCsv, motor };
}

describe('GET /api/account/export', () => {
  it('answers a zip of everything that is the member’s own, in open formats, with a README; nothing of anyone else', async () => {
    const m = await busyMember();
    const other = await signedInClient(t);
    const othersDraft = await createDraftGuide(other.client, { title: 'Someone else entirely' });

    const { res, files } = await exportOf(m.client);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/zip');
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="tunewright-data-\d{4}-\d{2}-\d{2}\.zip"/);
    expect(res.headers['cache-control']).toBe('private, no-store');

    expect(text(files, 'README.md')).toMatch(/^# Your Tunewright data/);
    expect(JSON.parse(text(files, 'profile.json'))).toMatchObject({
      id: m.user.id,
      email: m.user.email,
      displayName: m.user.displayName,
      watchMail: 'immediate',
    });

    const revisions = JSON.parse(text(files, 'revisions/revisions.json')) as Array<{ id: string; state: string; slug: string }>;
    expect(revisions.map((r) => r.id).sort()).toEqual([m.published.revisionId, m.edit.id, m.draft.revision.id].sort());
    expect(revisions.find((r) => r.id === m.edit.id)).toMatchObject({ state: 'draft', slug: m.published.slug });
    expect(text(files, `revisions/guide-${m.draft.slug}-v1.md`)).toContain('## Gearing');
    expect(revisions.some((r) => r.id === othersDraft.revision.id)).toBe(false);

    const setups = JSON.parse(text(files, 'setups/setups.json')) as Array<{ id: string; file: string; record: { notes: string } }>;
    expect(setups).toHaveLength(1);
    expect(setups[0]).toMatchObject({ id: m.setupId, record: { notes: 'Leaver setup notes' } });
    expect(text(files, setups[0].file)).toBe(m.setupBody); // byte for byte as uploaded

    const runs = JSON.parse(text(files, 'runs/runs.json')) as Array<{ id: string; file: string; channels: string[] }>;
    expect(runs.map((r) => r.id)).toEqual([m.runId]);
    expect(runs[0].channels.length).toBeGreaterThan(0);
    expect(text(files, runs[0].file)).toBe(m.runCsv);

    const motors = JSON.parse(text(files, 'motors/motors.json')) as Array<{ id: string; label: string; checks: unknown[]; checksCsv: string }>;
    expect(motors).toHaveLength(1);
    expect(motors[0]).toMatchObject({ id: m.motor.id, label: 'Leaver spare 13.5' });
    expect(motors[0].checks).toHaveLength(1);
    const csv = text(files, motors[0].checksCsv).split('\r\n');
    expect(csv[0]).toMatch(/^motor,check id,tested at \(UTC\),reference,/);
    expect(csv[1]).toMatch(/^Leaver spare 13\.5,/);

    // Authors watch what they write.
    expect((JSON.parse(text(files, 'watches.json')) as Array<{ slug: string }>).map((w) => w.slug).sort()).toEqual([m.published.slug, m.draft.slug].sort());
    const everything = Object.values(files)
      .map((f) => strFromU8(f))
      .join('\n');
    expect(everything).not.toContain(other.user.email);
    expect(everything).not.toContain('Someone else entirely');
  });

  it('401 for a visitor', async () => {
    const res = await createClient(t.app).get('/api/account/export');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });
});

describe('DELETE /api/account', () => {
  it('refuses a wrong password (400 naming the field) and changes nothing', async () => {
    const m = await busyMember();
    const res = await m.client.delete('/api/account', { currentPassword: 'not-my-password-at-all' });
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({
      code: 'validation_failed',
      details: [{ path: 'body.currentPassword', message: 'That is not your current password' }],
    });
    expect((await m.client.get('/api/auth/me')).body.data.user.id).toBe(m.user.id);
    expect((await t.db.dataSource.getRepository(UserEntity).findOneByOrFail({ id: m.user.id })).deletedAt).toBeNull();
    const missing = await m.client.delete('/api/account', {});
    expect(missing.status).toBe(400);
    expect(missing.body.error.details[0].path).toBe('body.currentPassword');
  });

  it('removes private data and credentials, keeps the published version credited to "Former member", ends every session and mails a confirmation', async () => {
    const m = await busyMember();
    const oldEmail = m.user.email;
    // A second signed-in device.
    const phone = createClient(t.app);
    expect((await phone.post('/api/auth/sign-in', { email: oldEmail, password: m.password })).status).toBe(200);
    phone.resetCsrf();
    // The guide page is cached with the author's name before the deletion.
    const before = await createClient(t.app).get(`/api/guides/${m.published.slug}`);
    expect(before.body.data.guide.author.displayName).toBe(m.user.displayName);
    const storedKeys: Array<{ key: string }> = await t.db.dataSource.query(
      `SELECT storage_key AS key FROM setups WHERE owner_id = $1 UNION ALL SELECT raw_key FROM runs WHERE owner_id = $1 UNION ALL SELECT data_key FROM runs WHERE owner_id = $1`,
      [m.user.id],
    );
    expect(storedKeys).toHaveLength(3);

    const res = await m.client.delete('/api/account', { currentPassword: m.password });
    expect(res.status, JSON.stringify(res.body)).toBe(204);
    expect(String(res.headers['set-cookie'])).toMatch(/tw\.sid=;/);

    // Signed out everywhere; the old credentials open nothing.
    m.client.resetCsrf();
    expect((await m.client.get('/api/auth/me')).body.data.user).toBeNull();
    expect((await phone.get('/api/auth/me')).body.data.user).toBeNull();
    const again = await createClient(t.app).post('/api/auth/sign-in', { email: oldEmail, password: m.password });
    expect(again.status).toBe(401);
    expect(again.body.error.code).toBe('invalid_credentials');

    // The row stays as a name with nothing personal in it.
    const row = await t.db.dataSource.getRepository(UserEntity).findOneByOrFail({ id: m.user.id });
    expect(row).toMatchObject({ displayName: FORMER_MEMBER_NAME, role: 'member', emailVerifiedAt: null });
    expect(row.email).not.toContain(oldEmail.split('@')[0]);
    expect(row.deletedAt).toBeInstanceOf(Date);
    expect(row.disabledAt).toBeInstanceOf(Date);

    // Published: kept, credited to the neutral name (the cached page dropped the old one).
    const visitor = createClient(t.app);
    await expect.poll(async () => (await visitor.get(`/api/guides/${m.published.slug}`)).body.data.guide.author.displayName).toBe(FORMER_MEMBER_NAME);
    const history = await visitor.get(`/api/guides/${m.published.slug}/revisions`);
    expect(history.body.data.map((r: { id: string; author: { displayName: string } }) => [r.id, r.author.displayName])).toEqual([
      [m.published.revisionId, FORMER_MEMBER_NAME],
    ]);

    // Private: gone.
    const count = async (sql: string) => Number((await t.db.dataSource.query(sql, [m.user.id]))[0].n);
    expect(await count(`SELECT count(*) AS n FROM revisions WHERE author_id = $1 AND state <> 'published'`)).toBe(0);
    expect(await count(`SELECT count(*) AS n FROM documents WHERE created_by = $1 AND published_revision_id IS NULL`)).toBe(0);
    expect((await moderator.get(`/api/guides/${m.draft.slug}/revisions`)).status).toBe(404);
    for (const table of ['setups', 'runs', 'motors']) expect(await count(`SELECT count(*) AS n FROM ${table} WHERE owner_id = $1`), table).toBe(0);
    for (const table of ['watches', 'watch_preferences', 'user_tokens'])
      expect(await count(`SELECT count(*) AS n FROM ${table} WHERE user_id = $1`), table).toBe(0);
    for (const { key } of storedKeys) expect(await t.ctx.storage.get(key), key).toBeNull();

    // Audited, and the old address is told.
    const [audit] = await t.db.dataSource.query(`SELECT actor_id, from_value, to_value FROM audit_log WHERE action = 'user.delete' AND subject_id = $1`, [
      m.user.id,
    ]);
    expect(audit).toEqual({ actor_id: m.user.id, from_value: 'active', to_value: 'deleted' });
    const mail = await t.waitForMail(oldEmail, /^Your Tunewright account was deleted$/);
    expect(mail.text).toContain('credited to "Former member"');

    // Administrators no longer see a person to manage.
    const admin = (await signedInClient(t, 'admin')).client;
    const list = await admin.get(`/api/admin/users?q=${encodeURIComponent('former')}&pageSize=100`);
    expect(list.body.data.map((u: { id: string }) => u.id)).not.toContain(m.user.id);
    const patch = await admin.patch(`/api/admin/users/${m.user.id}`, { disabled: false });
    expect(patch.status).toBe(404);
  });

  it('refuses the last administrator (409 last_admin) and lets one go once another administrator exists', async () => {
    const ds = t.db.dataSource;
    // This file's own database: make the account under test the only active administrator.
    await ds.query(`UPDATE users SET role = 'moderator' WHERE role = 'admin'`);
    const { client, user } = await signedInClient(t, 'admin');
    const refused = await client.delete('/api/account', { currentPassword: STRONG_PASSWORD });
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('last_admin');
    expect((await client.get('/api/auth/me')).body.data.user.id).toBe(user.id);
    // A disabled administrator does not count.
    await createUser(t, { role: 'admin', disabled: true });
    expect((await client.delete('/api/account', { currentPassword: STRONG_PASSWORD })).body.error.code).toBe('last_admin');

    await createUser(t, { role: 'admin' });
    const ok = await client.delete('/api/account', { currentPassword: STRONG_PASSWORD });
    expect(ok.status, JSON.stringify(ok.body)).toBe(204);
    expect((await ds.getRepository(UserEntity).findOneByOrFail({ id: user.id })).role).toBe('member');
  });

  it('401 for a visitor', async () => {
    const res = await createClient(t.app).delete('/api/account', { currentPassword: 'anything-at-all' });
    expect(res.status).toBe(401);
  });
});
