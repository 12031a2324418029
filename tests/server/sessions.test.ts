import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createClient, createTestApp, type TestApp } from '../setup/test-app';
import { createUser } from '../factories/user';

// Session lifecycle beyond auth.test.ts and admin.test.ts: the OLD session id stops working whenever
// the id is rotated or the session ends (fixation), and a password reset ends every session.
let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

/** The tw.sid cookie pair ("tw.sid=…") from a response, if it set one. */
function sidCookie(res: request.Response) {
  const cookies = (res.headers['set-cookie'] as unknown as string[] | undefined) ?? [];
  return cookies.find((c) => c.startsWith('tw.sid=') && !c.startsWith('tw.sid=;'))?.split(';')[0];
}
/** The session id inside a signed cookie value ("s:<id>.<signature>"). */
const sessionId = (cookie: string) => decodeURIComponent(cookie.slice('tw.sid='.length)).replace(/^s:/, '').split('.')[0];
const meWith = async (cookie: string) => (await request(t.app).get('/api/auth/me').set('Cookie', cookie)).body.data.user;
const storedSessions = async (sid: string) => (await t.db.dataSource.query(`SELECT count(*)::int n FROM session WHERE sid = $1`, [sid]))[0].n as number;
const tokenFrom = (text: string) => /token=([A-Za-z0-9_-]+)/.exec(text)?.[1] ?? '';

describe('POST /api/auth/sign-in', () => {
  it('replaces the pre-sign-in session id, so a planted (fixated) id never becomes signed in', async () => {
    const { user, password } = await createUser(t);
    const client = createClient(t.app);
    const visitorCookie = sidCookie(await client.get('/api/csrf'));
    expect(visitorCookie).toBeDefined();
    expect(await storedSessions(sessionId(visitorCookie!))).toBe(1);

    const res = await client.post('/api/auth/sign-in', { email: user.email, password });
    expect(res.status).toBe(200);
    const signedIn = sidCookie(res)!;
    expect(sessionId(signedIn)).not.toBe(sessionId(visitorCookie!));
    expect((await meWith(signedIn))?.id).toBe(user.id);
    // The id an attacker could have planted before sign-in is dead.
    expect(await meWith(visitorCookie!)).toBeNull();
    expect(await storedSessions(sessionId(visitorCookie!))).toBe(0);
  });

  it('ignores a made-up session id and issues a fresh one', async () => {
    const forged = 'tw.sid=s%3Aforged-session-id.notavalidsignature';
    const res = await request(t.app).get('/api/csrf').set('Cookie', forged);
    expect(res.status).toBe(200);
    const issued = sidCookie(res)!;
    expect(issued).toBeDefined();
    expect(sessionId(issued)).not.toBe('forged-session-id');
  });
});

describe('POST /api/auth/sign-out', () => {
  it('deletes the session on the server, so a copied cookie is useless afterwards', async () => {
    const { user, password } = await createUser(t);
    const client = createClient(t.app);
    const cookie = sidCookie(await client.post('/api/auth/sign-in', { email: user.email, password }))!;
    client.resetCsrf();
    expect((await meWith(cookie))?.id).toBe(user.id);
    expect((await client.post('/api/auth/sign-out')).status).toBe(204);
    expect(await meWith(cookie)).toBeNull();
    expect(await storedSessions(sessionId(cookie))).toBe(0);
  });
});

describe('POST /api/account/password', () => {
  it('kills the session id used before the change (the client gets a new one)', async () => {
    const { user, password } = await createUser(t);
    const client = createClient(t.app);
    const before = sidCookie(await client.post('/api/auth/sign-in', { email: user.email, password }))!;
    client.resetCsrf();
    const res = await client.post('/api/account/password', { currentPassword: password, newPassword: 'quay-lantern-harbour-tide-58' });
    expect(res.status).toBe(200);
    const after = sidCookie(res)!;
    expect(sessionId(after)).not.toBe(sessionId(before));
    expect(await meWith(before)).toBeNull();
    expect((await meWith(after))?.id).toBe(user.id);
  });
});

describe('POST /api/auth/reset-password', () => {
  it('ends every session of the account', async () => {
    const { user, password } = await createUser(t);
    const phone = createClient(t.app);
    const laptop = createClient(t.app);
    const phoneCookie = sidCookie(await phone.post('/api/auth/sign-in', { email: user.email, password }))!;
    const laptopCookie = sidCookie(await laptop.post('/api/auth/sign-in', { email: user.email, password }))!;
    expect((await meWith(phoneCookie))?.id).toBe(user.id);

    const stranger = createClient(t.app);
    expect((await stranger.post('/api/auth/forgot-password', { email: user.email })).status).toBe(202);
    const token = tokenFrom((await t.waitForMail(user.email, /reset/i)).text);
    expect((await stranger.post('/api/auth/reset-password', { token, password: 'slipway-compass-tide-clay-27' })).status).toBe(200);

    expect(await meWith(phoneCookie)).toBeNull();
    expect(await meWith(laptopCookie)).toBeNull();
    const left = await t.db.dataSource.query(`SELECT count(*)::int n FROM session WHERE sess->'passport'->>'user' = $1`, [user.id]);
    expect(left[0].n).toBe(0);
  });
});
