import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createClient, createTestApp, type TestApp } from '../setup/test-app';
import { createUser, signedInClient } from '../factories/user';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
});
afterAll(async () => {
  await t.close();
});

describe('GET /api/admin/users', () => {
  it('lists and searches accounts for an admin', async () => {
    const { client } = await signedInClient(t, 'admin');
    await createUser(t, { email: 'findme-quill@tidewater.test', displayName: 'Quill Findable' });
    const all = await client.get('/api/admin/users');
    expect(all.status).toBe(200);
    expect(all.body.meta.total).toBeGreaterThanOrEqual(2);
    expect(all.body.data[0]).toHaveProperty('disabled');
    const byName = await client.get('/api/admin/users?q=quill');
    expect(byName.body.data.map((u: { email: string }) => u.email)).toEqual(['findme-quill@tidewater.test']);
    const byMail = await client.get('/api/admin/users?q=FINDME');
    expect(byMail.body.data).toHaveLength(1);
    const bad = await client.get('/api/admin/users?page=0');
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('query.page');
  });

  it('refuses members (403) and visitors (401)', async () => {
    const { client } = await signedInClient(t, 'member');
    expect((await client.get('/api/admin/users')).status).toBe(403);
    expect((await createClient(t.app).get('/api/admin/users')).status).toBe(401);
  });
});

describe('PATCH /api/admin/users/:id', () => {
  it('grants the moderator role with a reason and writes an audit row that keeps it', async () => {
    const { client, user: admin } = await signedInClient(t, 'admin');
    const { user } = await createUser(t);
    const res = await client.patch(`/api/admin/users/${user.id}`, { role: 'moderator', reason: 'Reviews for the winter series' });
    expect(res.status).toBe(200);
    expect(res.body.data.user.role).toBe('moderator');
    const audit = await t.db.dataSource.query(`SELECT actor_id, action, from_value, to_value, reason FROM audit_log WHERE subject_id = $1`, [user.id]);
    expect(audit).toEqual([{ actor_id: admin.id, action: 'user.role', from_value: 'member', to_value: 'moderator', reason: 'Reviews for the winter series' }]);
  });

  it('refuses a role change or a disabling without a reason (400 on body.reason), and changes nothing', async () => {
    const { client } = await signedInClient(t, 'admin');
    const { user } = await createUser(t);
    for (const body of [{ role: 'moderator' }, { disabled: true }, { role: 'admin', reason: ' ab ' }, { disabled: true, reason: '' }]) {
      const res = await client.patch(`/api/admin/users/${user.id}`, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.details.map((d: { path: string }) => d.path)).toEqual(['body.reason']);
    }
    const [row] = await t.db.dataSource.query(`SELECT role, disabled_at FROM users WHERE id = $1`, [user.id]);
    expect(row).toEqual({ role: 'member', disabled_at: null });
    expect((await t.db.dataSource.query(`SELECT count(*)::int n FROM audit_log WHERE subject_id = $1`, [user.id]))[0].n).toBe(0);
  });

  it('disabling an account ends its sessions at once', async () => {
    const { client: admin } = await signedInClient(t, 'admin');
    const { client: victim, user } = await signedInClient(t, 'member');
    expect((await victim.get('/api/auth/me')).body.data.user.id).toBe(user.id);
    const res = await admin.patch(`/api/admin/users/${user.id}`, { disabled: true, reason: 'Posting copied manuals' });
    expect(res.body.data.user.disabled).toBe(true);
    expect((await victim.get('/api/auth/me')).body.data.user).toBeNull();
    const sessions = await t.db.dataSource.query(`SELECT count(*)::int n FROM session WHERE sess->'passport'->>'user' = $1`, [user.id]);
    expect(sessions[0].n).toBe(0);
    const [audit] = await t.db.dataSource.query(`SELECT action, reason FROM audit_log WHERE subject_id = $1`, [user.id]);
    expect(audit).toEqual({ action: 'user.disable', reason: 'Posting copied manuals' });
  });

  it('a disabled account is told so only after the right password; a wrong one gets the usual answer', async () => {
    const { client: admin } = await signedInClient(t, 'admin');
    const { user, password } = await createUser(t);
    expect((await admin.patch(`/api/admin/users/${user.id}`, { disabled: true, reason: 'Posting copied manuals' })).status).toBe(200);
    const unknown = await createClient(t.app).post('/api/auth/sign-in', { email: 'nobody-here@tidewater.test', password: 'some-wrong-password-here' });
    const wrong = await createClient(t.app).post('/api/auth/sign-in', { email: user.email, password: 'some-wrong-password-here' });
    // The wrong password reads exactly like an unknown address: nothing about the account's state.
    expect(wrong.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body.error.code).toBe('invalid_credentials');
    const right = createClient(t.app);
    const res = await right.post('/api/auth/sign-in', { email: user.email, password });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('account_disabled');
    expect(res.body.error.message).toMatch(/disabled/);
    expect((await right.get('/api/auth/me')).body.data.user).toBeNull();
    // Enabling needs no reason; the account signs in again.
    const enabled = await admin.patch(`/api/admin/users/${user.id}`, { disabled: false });
    expect(enabled.status).toBe(200);
    expect((await createClient(t.app).post('/api/auth/sign-in', { email: user.email, password })).status).toBe(200);
  });

  it('refuses changing yourself, unknown ids and empty patches', async () => {
    const { client, user } = await signedInClient(t, 'admin');
    const reason = 'Testing the refusals';
    const self = await client.patch(`/api/admin/users/${user.id}`, { role: 'member', reason });
    expect(self.status).toBe(409);
    expect(self.body.error.code).toBe('cannot_change_self');
    expect((await client.patch('/api/admin/users/00000000-0000-4000-8000-000000000000', { role: 'member', reason })).status).toBe(404);
    expect((await client.patch('/api/admin/users/not-a-uuid', { role: 'member', reason })).status).toBe(400);
    expect((await client.patch(`/api/admin/users/${user.id}`, {})).status).toBe(400);
    expect((await client.patch(`/api/admin/users/${user.id}`, { role: 'superuser', reason })).body.error.details[0].path).toBe('body.role');
  });
});

describe('account', () => {
  it('PATCH /api/account changes the display name', async () => {
    const { client } = await signedInClient(t, 'member');
    const res = await client.patch('/api/account', { displayName: 'Pit Lane Regular' });
    expect(res.status).toBe(200);
    expect((await client.get('/api/auth/me')).body.data.user.displayName).toBe('Pit Lane Regular');
  });

  it('PATCH /api/account keeps the display units (metric by default), alone or with the name', async () => {
    const { client } = await signedInClient(t, 'member');
    const before = (await client.get('/api/auth/me')).body.data.user;
    expect(before.units).toBe('metric');
    const res = await client.patch('/api/account', { units: 'imperial' });
    expect(res.status).toBe(200);
    expect(res.body.data.user).toMatchObject({ units: 'imperial', displayName: before.displayName });
    expect((await client.get('/api/auth/me')).body.data.user.units).toBe('imperial');
    await client.patch('/api/account', { displayName: 'Oval Night Regular', units: 'metric' });
    expect((await client.get('/api/auth/me')).body.data.user).toMatchObject({ units: 'metric', displayName: 'Oval Night Regular' });
    // Neither field, or a system we do not have: the one error shape, nothing changed.
    for (const body of [{}, { units: 'furlongs' }, { units: 1 }]) {
      const bad = await client.patch('/api/account', body);
      expect(bad.status).toBe(400);
      expect(bad.body.error.code).toBe('validation_failed');
    }
    expect((await client.get('/api/auth/me')).body.data.user.units).toBe('metric');
  });

  it('POST /api/account/password rotates the session and ends the others', async () => {
    const { user, password } = await createUser(t);
    const a = createClient(t.app);
    const b = createClient(t.app);
    await a.post('/api/auth/sign-in', { email: user.email, password });
    await b.post('/api/auth/sign-in', { email: user.email, password });
    a.resetCsrf();
    const before = String((await a.get('/api/auth/me')).request.cookies ?? '');
    const wrong = await a.post('/api/account/password', { currentPassword: 'nope-nope-nope-nope', newPassword: 'another-long-tidal-phrase-7' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.details[0].path).toBe('body.currentPassword');
    const ok = await a.post('/api/account/password', { currentPassword: password, newPassword: 'another-long-tidal-phrase-7' });
    expect(ok.status).toBe(200);
    expect(String(ok.headers['set-cookie'])).toMatch(/tw\.sid=/);
    expect(String(ok.headers['set-cookie'])).not.toContain(before || 'never-matches');
    a.resetCsrf();
    expect((await a.get('/api/auth/me')).body.data.user?.id).toBe(user.id);
    expect((await b.get('/api/auth/me')).body.data.user).toBeNull();
  });
});
