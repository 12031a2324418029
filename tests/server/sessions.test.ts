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

describe('session lifetime (idle timeout and absolute lifetime)', () => {
  /** Moves the stored session's clock marks back, as if that much time had passed. */
  async function age(cookie: string, marks: { idleH?: number; sinceSignInH?: number }) {
    const sid = sessionId(cookie);
    const [{ sess }] = await t.db.dataSource.query(`SELECT sess FROM session WHERE sid = $1`, [sid]);
    const now = Date.now();
    if (marks.idleH !== undefined) sess.lastSeenAt = now - marks.idleH * 3600_000;
    if (marks.sinceSignInH !== undefined) sess.signedInAt = now - marks.sinceSignInH * 3600_000;
    await t.db.dataSource.query(`UPDATE session SET sess = $2 WHERE sid = $1`, [sid, JSON.stringify(sess)]);
  }
  async function signIn(role: 'member' | 'moderator' | 'admin') {
    const { user, password } = await createUser(t, { role });
    const client = createClient(t.app);
    const res = await client.post('/api/auth/sign-in', { email: user.email, password });
    expect(res.status).toBe(200);
    return { user, cookie: sidCookie(res)! };
  }

  it('signs a member out after two idle days, but not after one', async () => {
    const { user, cookie } = await signIn('member');
    await age(cookie, { idleH: 47 });
    expect((await meWith(cookie))?.id).toBe(user.id);
    await age(cookie, { idleH: 49 });
    expect(await meWith(cookie)).toBeNull();
    // Signed out for good: the same cookie does not come back to life.
    expect(await meWith(cookie)).toBeNull();
  });

  it('gives moderators and admins a shorter idle timeout than members', async () => {
    for (const role of ['moderator', 'admin'] as const) {
      const { user, cookie } = await signIn(role);
      await age(cookie, { idleH: 11 });
      expect((await meWith(cookie))?.id, role).toBe(user.id);
      await age(cookie, { idleH: 13 });
      expect(await meWith(cookie), role).toBeNull();
    }
    const member = await signIn('member');
    await age(member.cookie, { idleH: 13 });
    expect((await meWith(member.cookie))?.id).toBe(member.user.id);
  });

  it('ends a session 14 days after sign-in however active it was', async () => {
    const { user, cookie } = await signIn('member');
    await age(cookie, { sinceSignInH: 13 * 24, idleH: 0 });
    expect((await meWith(cookie))?.id).toBe(user.id);
    await age(cookie, { sinceSignInH: 14 * 24 + 1, idleH: 0 });
    expect(await meWith(cookie)).toBeNull();
  });

  it('records the sign-in time and refreshes the idle mark as the member uses the session', async () => {
    const { cookie } = await signIn('member');
    const read = async () => (await t.db.dataSource.query(`SELECT sess FROM session WHERE sid = $1`, [sessionId(cookie)]))[0].sess;
    const first = await read();
    expect(Math.abs(first.signedInAt - Date.now())).toBeLessThan(60_000);
    await age(cookie, { idleH: 5 });
    expect(await meWith(cookie)).not.toBeNull();
    expect(Date.now() - (await read()).lastSeenAt).toBeLessThan(60_000);
  });

  it('takes its limits from the configuration', async () => {
    const short = await createTestApp({ SESSION_IDLE_HOURS: '1', SESSION_ABSOLUTE_DAYS: '1' }, { catcher: false });
    try {
      expect(short.ctx.config.sessions).toEqual({ idleMs: 3600_000, privilegedIdleMs: 3600_000, absoluteMs: 86_400_000 });
    } finally {
      await short.close();
    }
  });
});
