import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createClient, createTestApp, type TestApp } from '../setup/test-app';
import { createUser, STRONG_PASSWORD } from '../factories/user';
import { UserEntity } from '../../server/modules/auth/user.entity';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

const tokenFrom = (text: string) => /token=([A-Za-z0-9_-]+)/.exec(text)?.[1] ?? '';

describe('GET /api/csrf', () => {
  it('returns a token, and state-changing calls without it are refused', async () => {
    const client = createClient(t.app);
    const res = await client.get('/api/csrf').expect(200);
    expect(res.body.data.token).toMatch(/.{20,}/);
    const refused = await client.agent.post('/api/auth/sign-in').send({ email: 'a@b.test', password: 'x' });
    expect(refused.status).toBe(403);
    expect(refused.body.error.code).toBe('csrf_invalid');
  });
});

describe('POST /api/auth/sign-up', () => {
  it('creates an unverified member and sends a verification mail that carries no text the sign-up chose', async () => {
    const client = createClient(t.app);
    const displayName = 'Win a prize at https://prize.example';
    const res = await client.post('/api/auth/sign-up', { email: 'Newcomer@Tidewater.test', displayName, password: STRONG_PASSWORD });
    expect(res.status).toBe(202);
    expect(res.body).toEqual({ data: { email: 'newcomer@tidewater.test', sent: true } });
    const user = await t.db.dataSource.getRepository(UserEntity).findOneByOrFail({ email: 'newcomer@tidewater.test' });
    expect(user).toMatchObject({ displayName, role: 'member', emailVerifiedAt: null });
    const mail = await t.waitForMail('newcomer@tidewater.test', /confirm/i);
    expect(tokenFrom(mail.text)).toHaveLength(43);
    // Whoever typed the address also chose the name: it never reaches a mailbox nobody has proven.
    for (const part of [mail.text, mail.html, mail.subject]) expect(part).not.toContain('prize');
  });

  it('answers a taken address exactly as a new one, changes nothing, and tells the owner instead', async () => {
    const { user } = await createUser(t);
    const before = await t.db.dataSource.getRepository(UserEntity).findOneByOrFail({ id: user.id });
    const res = await createClient(t.app).post('/api/auth/sign-up', {
      email: user.email.toUpperCase(),
      displayName: 'Again <a href=x>',
      password: STRONG_PASSWORD,
    });
    const fresh = await createClient(t.app).post('/api/auth/sign-up', {
      email: 'someone-else@tidewater.test',
      displayName: 'Again',
      password: STRONG_PASSWORD,
    });
    expect(res.status).toBe(fresh.status);
    expect(res.status).toBe(202);
    expect(res.body).toEqual({ data: { email: user.email, sent: true } });
    expect(Object.keys(res.body.data)).toEqual(Object.keys(fresh.body.data));
    expect(await t.db.dataSource.getRepository(UserEntity).findOneByOrFail({ id: user.id })).toEqual(before);
    expect(await t.db.dataSource.getRepository(UserEntity).countBy({ email: user.email })).toBe(1);
    const mail = await t.waitForMail(user.email, /already have/i);
    expect(mail.text).toContain('/forgot-password');
    expect(mail.text).not.toContain('Again');
    expect(mail.html).not.toContain('href=x');
  });

  it('refuses short, long and common passwords with a clear message, storing nothing', async () => {
    const client = createClient(t.app);
    const cases = ['short-pass', 'x'.repeat(129), 'password1234'];
    for (const password of cases) {
      const email = `weak-${password.length}@tidewater.test`;
      const res = await client.post('/api/auth/sign-up', { email, displayName: 'Weak', password });
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.details[0].path).toBe('body.password');
      expect(await t.db.dataSource.getRepository(UserEntity).countBy({ email })).toBe(0);
    }
  });

  it('names every bad field', async () => {
    const res = await createClient(t.app).post('/api/auth/sign-up', { email: 'not-an-email', displayName: '', password: 1 });
    expect(res.status).toBe(400);
    const paths = res.body.error.details.map((d: { path: string }) => d.path).sort();
    expect(paths).toEqual(['body.displayName', 'body.email', 'body.password']);
  });
});

describe('POST /api/auth/verify and sign-in', () => {
  it('walks sign-up → verify → sign-in → me → sign-out', async () => {
    const client = createClient(t.app);
    expect((await client.post('/api/auth/sign-up', { email: 'journey@tidewater.test', displayName: 'Journey', password: STRONG_PASSWORD })).status).toBe(202);

    const early = await client.post('/api/auth/sign-in', { email: 'journey@tidewater.test', password: STRONG_PASSWORD });
    expect(early.status).toBe(403);
    expect(early.body.error.code).toBe('email_unverified');

    const token = tokenFrom((await t.waitForMail('journey@tidewater.test', /confirm/i)).text);
    const verified = await client.post('/api/auth/verify', { token });
    expect(verified.status).toBe(200);
    expect(verified.body.data.user.emailVerified).toBe(true);
    // Confirming signs the person in, on a new session id.
    expect(verified.body.data.signedIn).toBe(true);
    expect(String(verified.headers['set-cookie'])).toMatch(/tw\.sid=/);
    client.resetCsrf();
    expect((await client.get('/api/auth/me')).body.data.user).toMatchObject({ email: 'journey@tidewater.test', emailVerified: true });
    expect((await client.post('/api/auth/sign-out')).status).toBe(204);
    client.resetCsrf();
    const reused = await client.post('/api/auth/verify', { token });
    expect(reused.status).toBe(400);
    expect(reused.body.error.code).toBe('token_invalid');

    const before = (await client.get('/api/auth/me')).headers['set-cookie'];
    const signIn = await client.post('/api/auth/sign-in', { email: 'journey@tidewater.test', password: STRONG_PASSWORD });
    expect(signIn.status).toBe(200);
    const sidAfter = String(signIn.headers['set-cookie']).match(/tw\.sid=([^;]+)/)?.[1];
    expect(sidAfter).toBeTruthy();
    expect(String(before ?? '')).not.toContain(sidAfter!);
    client.resetCsrf();

    const me = await client.get('/api/auth/me');
    expect(me.body.data.user).toMatchObject({ email: 'journey@tidewater.test', emailVerified: true, role: 'member' });

    expect((await client.post('/api/auth/sign-out')).status).toBe(204);
    client.resetCsrf();
    expect((await client.get('/api/auth/me')).body.data.user).toBeNull();
  });

  it('gives the same answer for an unknown e-mail and a wrong password', async () => {
    const { user } = await createUser(t);
    const client = createClient(t.app);
    const wrong = await client.post('/api/auth/sign-in', { email: user.email, password: 'not-the-password-at-all' });
    const unknown = await client.post('/api/auth/sign-in', { email: 'nobody@tidewater.test', password: 'not-the-password-at-all' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body.error.code).toBe('invalid_credentials');
  });
});

describe('POST /api/auth/forgot-password and reset-password', () => {
  it('answers 202 for any address and resets with a single-use token', async () => {
    const { user } = await createUser(t);
    const client = createClient(t.app);
    expect((await client.post('/api/auth/forgot-password', { email: 'ghost@tidewater.test' })).status).toBe(202);
    expect((await client.post('/api/auth/forgot-password', { email: user.email })).status).toBe(202);
    const token = tokenFrom((await t.waitForMail(user.email, /reset/i)).text);
    const newPassword = 'fresh-tide-chart-harbour-19';
    expect((await client.post('/api/auth/reset-password', { token, password: newPassword })).status).toBe(200);
    expect((await client.post('/api/auth/reset-password', { token, password: newPassword })).body.error.code).toBe('token_invalid');
    expect((await client.post('/api/auth/sign-in', { email: user.email, password: newPassword })).status).toBe(200);
  });

  it('answers before doing any work, so an address with an account takes no longer than one without', async () => {
    const { user } = await createUser(t);
    const client = createClient(t.app);
    // Hold the outbox: preparing a reset for a real account must write to it, an unknown address writes nothing.
    // Were the work done before answering, the first request would wait here for the lock.
    const holder = t.db.dataSource.createQueryRunner();
    await holder.connect();
    await holder.startTransaction();
    try {
      await holder.query('LOCK TABLE outbox IN ACCESS EXCLUSIVE MODE');
      for (const email of [user.email, 'ghost-timing@tidewater.test']) {
        const started = Date.now();
        const res = await client.post('/api/auth/forgot-password', { email });
        expect(res.status, email).toBe(202);
        expect(res.body).toEqual({ data: { sent: true } });
        expect(Date.now() - started, `${email} answered without waiting for the work`).toBeLessThan(1500);
      }
    } finally {
      await holder.rollbackTransaction();
      await holder.release();
    }
    // The work still happens once the outbox is free again.
    expect(tokenFrom((await t.waitForMail(user.email, /reset/i)).text)).toHaveLength(43);
  });

  it('refuses an expired token', async () => {
    const { user } = await createUser(t);
    const client = createClient(t.app);
    expect((await client.post('/api/auth/forgot-password', { email: user.email })).status).toBe(202);
    const token = tokenFrom((await t.waitForMail(user.email, /reset/i)).text);
    await t.db.dataSource.query(`UPDATE user_tokens SET expires_at = now() - interval '1 minute' WHERE user_id = $1`, [user.id]);
    const res = await client.post('/api/auth/reset-password', { token, password: 'another-strong-harbour-pass' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('token_invalid');
  });
});

describe('rate limits', () => {
  it('answers 429 in the error shape once the sign-in budget is spent', async () => {
    const limited = await createTestApp({ RATE_LIMIT_AUTH_PER_15MIN: '3' }, { catcher: false });
    try {
      const client = createClient(limited.app);
      const codes: number[] = [];
      for (let i = 0; i < 5; i++) codes.push((await client.post('/api/auth/sign-in', { email: 'x@tidewater.test', password: 'whatever-password' })).status);
      expect(codes.slice(0, 3)).toEqual([401, 401, 401]);
      const last = await client.post('/api/auth/sign-in', { email: 'x@tidewater.test', password: 'whatever-password' });
      expect(last.status).toBe(429);
      expect(last.body.error.code).toBe('rate_limited');
    } finally {
      await limited.close();
    }
  });
});

describe('errors', () => {
  it('answers unknown API routes with a JSON 404', async () => {
    const res = await createClient(t.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });

  it('answers malformed JSON with 400, wrong content type with 415, huge bodies with 413', async () => {
    const client = createClient(t.app);
    const token = (await client.get('/api/csrf')).body.data.token;
    const bad = await client.agent.post('/api/auth/sign-in').set('x-csrf-token', token).set('Content-Type', 'application/json').send('{"email":');
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('invalid_json');
    const text = await client.agent.post('/api/auth/sign-in').set('x-csrf-token', token).set('Content-Type', 'text/plain').send('email=a');
    expect(text.status).toBe(415);
    expect(text.body.error.code).toBe('unsupported_media_type');
    const huge = await client.agent
      .post('/api/auth/sign-in')
      .set('x-csrf-token', token)
      .send({ email: 'a@b.test', password: 'x'.repeat(600 * 1024) });
    expect(huge.status).toBe(413);
    expect(huge.body.error.code).toBe('payload_too_large');
  });
});
