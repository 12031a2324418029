import crypto from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createClient, createTestApp, type TestApp } from '../setup/test-app';
import { createUser } from '../factories/user';
import { OutboxMessageEntity } from '../../server/modules/mail/outbox-message.entity';

// ASVS V6: the owner hears about every change to how they sign in, and guessing at one account's
// password is limited per account (in PostgreSQL), not only per address the guesses come from.
const LIMIT = 3;
let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ SIGN_IN_ATTEMPTS_PER_ACCOUNT_PER_15MIN: String(LIMIT) });
});
afterAll(async () => {
  await t.close();
});

const tokenFrom = (text: string) => /token=([A-Za-z0-9_-]+)/.exec(text)?.[1] ?? '';
const signIn = (email: string, password: string) => createClient(t.app).post('/api/auth/sign-in', { email, password });
const outboxTo = (to: string) => t.db.dataSource.getRepository(OutboxMessageEntity).countBy({ to });

/** The "changed on …" moment in a notice, read back as a date (V8's parser reads "2 June 2026 18:05 UTC"). */
function changedAt(text: string): number {
  const m = /was changed on (\w+) (\d{1,2} \w+ \d{4}) at (\d{2}:\d{2}) UTC/.exec(text);
  expect(m, text).not.toBeNull();
  const at = Date.parse(`${m![2]} ${m![3]} UTC`);
  // The weekday agrees with the date (ICU's names, not the app's).
  expect(m![1]).toBe(new Date(at).toLocaleDateString('en-GB', { weekday: 'long', timeZone: 'UTC' }));
  return at;
}

function expectNotice(mail: { to: string; subject: string; text: string; html: string | null }, email: string, how: RegExp) {
  expect(mail.subject).toBe('Your Tunewright password was changed');
  expect(mail.text).toContain(`(${email})`);
  expect(mail.text).toMatch(how);
  // When: to the minute, in UTC, and now.
  expect(Math.abs(changedAt(mail.text) - Date.now())).toBeLessThan(2 * 60_000);
  // What to do if it was not them: a way back in, and whom to tell.
  expect(mail.text).toMatch(/If it was not you/);
  expect(mail.text).toContain(`${t.ctx.config.appUrl}/forgot-password`);
  expect(mail.text).toMatch(/moderator/);
  expect(mail.html).toContain(`href="${t.ctx.config.appUrl}/forgot-password"`);
}

describe('POST /api/account/password: account-change notice', () => {
  it('mails the account address what changed, when and how, and what to do if it was not them; a refused change mails nothing', async () => {
    const { user, password } = await createUser(t);
    const client = createClient(t.app);
    expect((await client.post('/api/auth/sign-in', { email: user.email, password })).status).toBe(200);
    client.resetCsrf();
    const wrong = await client.post('/api/account/password', { currentPassword: 'not-my-password-at-all', newPassword: 'quay-lantern-harbour-tide-58' });
    expect(wrong.status).toBe(400);
    expect(await outboxTo(user.email)).toBe(0);

    const res = await client.post('/api/account/password', { currentPassword: password, newPassword: 'quay-lantern-harbour-tide-58' });
    expect(res.status).toBe(200);
    const mail = await t.waitForMail(user.email, /password was changed/);
    expectNotice(mail, user.email, /from the account page/);
    expect(mail.text).toMatch(/except the one that made the change/);
    expect(await outboxTo(user.email)).toBe(1);
  });
});

describe('POST /api/auth/reset-password: account-change notice', () => {
  it('mails the notice after a reset, saying it came through a reset link', async () => {
    const { user } = await createUser(t);
    const client = createClient(t.app);
    expect((await client.post('/api/auth/forgot-password', { email: user.email })).status).toBe(202);
    const token = tokenFrom((await t.waitForMail(user.email, /reset/i)).text);
    expect((await client.post('/api/auth/reset-password', { token, password: 'fresh-tide-chart-harbour-19' })).status).toBe(200);
    const mail = await t.waitForMail(user.email, /password was changed/);
    expectNotice(mail, user.email, /with a password-reset link sent to this address/);
    expect(mail.text).toMatch(/Every session of the account was signed out\./);
  });
});

describe('POST /api/auth/sign-in: per-account limit', () => {
  const wrong = 'not-the-password-at-all';

  it(`answers 429 sign_in_throttled after ${LIMIT} attempts on one address, from any session, even with the right password; other accounts are unaffected`, async () => {
    const { user, password } = await createUser(t);
    for (let i = 0; i < LIMIT; i++) {
      // A fresh client each time: the limit is the account's, not the session's.
      const res = await signIn(user.email, wrong);
      expect(res.status, `attempt ${i + 1}`).toBe(401);
      expect(res.body.error.code).toBe('invalid_credentials');
    }
    const locked = await signIn(user.email, wrong);
    expect(locked.status).toBe(429);
    expect(Object.keys(locked.body)).toEqual(['error']);
    expect(locked.body.error).toEqual({
      code: 'sign_in_throttled',
      message: expect.stringMatching(/^Too many sign-in attempts for this e-mail address\. Wait 15 minutes .*reset your password/),
      details: { retryAfterSeconds: expect.any(Number) },
    });
    const retry = Number(locked.headers['retry-after']);
    expect(retry).toBeGreaterThan(14 * 60);
    expect(retry).toBeLessThanOrEqual(15 * 60);
    expect(locked.body.error.details.retryAfterSeconds).toBe(retry);
    // While the budget is spent the right password is refused too, or the limit would be an oracle.
    const right = await signIn(user.email, password);
    expect(right.status).toBe(429);
    expect(right.body.error.code).toBe('sign_in_throttled');
    // Differently typed, same address.
    expect((await signIn(`  ${user.email.toUpperCase()} `, password)).status).toBe(429);
    const other = await createUser(t);
    expect((await signIn(other.user.email, other.password)).status).toBe(200);
  });

  it('treats an address without an account exactly like one with an account (no enumeration)', async () => {
    const { user } = await createUser(t);
    const ghost = `ghost-${crypto.randomBytes(4).toString('hex')}@tidewater.test`;
    const statuses = async (email: string) => {
      const out: Array<{ status: number; code: string }> = [];
      for (let i = 0; i <= LIMIT; i++) {
        const res = await signIn(email, wrong);
        out.push({ status: res.status, code: res.body.error.code });
      }
      return out;
    };
    const real = await statuses(user.email);
    expect(await statuses(ghost)).toEqual(real);
    expect(real.at(-1)).toEqual({ status: 429, code: 'sign_in_throttled' });
    const [a, b] = [await signIn(user.email, wrong), await signIn(ghost, wrong)];
    expect(a.body.error.message).toBe(b.body.error.message);
  });

  it('counts parallel guesses exactly: only the budget gets a password check', async () => {
    const { user } = await createUser(t);
    const results = await Promise.all(Array.from({ length: 10 }, () => signIn(user.email, wrong)));
    const statuses = results.map((r) => r.status).sort();
    expect(statuses).toEqual([...Array(LIMIT).fill(401), ...Array(10 - LIMIT).fill(429)]);
  });

  it('a successful sign-in clears the count; an ended window starts a new budget', async () => {
    const { user, password } = await createUser(t);
    for (let i = 0; i < LIMIT - 1; i++) expect((await signIn(user.email, wrong)).status).toBe(401);
    expect((await signIn(user.email, password)).status).toBe(200);
    for (let i = 0; i < LIMIT; i++) expect((await signIn(user.email, wrong)).status, `after success, attempt ${i + 1}`).toBe(401);
    expect((await signIn(user.email, password)).status).toBe(429);
    // As if the 15 minutes had passed.
    const key = crypto.createHash('sha256').update(user.email).digest('hex');
    await t.db.dataSource.query(`UPDATE sign_in_attempts SET window_started_at = now() - interval '16 minutes' WHERE email_key = $1`, [key]);
    expect((await signIn(user.email, password)).status).toBe(200);
  });

  it('a password reset lets a locked-out member straight back in', async () => {
    const { user } = await createUser(t);
    for (let i = 0; i <= LIMIT; i++) await signIn(user.email, wrong);
    expect((await signIn(user.email, wrong)).status).toBe(429);
    const client = createClient(t.app);
    expect((await client.post('/api/auth/forgot-password', { email: user.email })).status).toBe(202);
    const token = tokenFrom((await t.waitForMail(user.email, /reset/i)).text);
    expect((await client.post('/api/auth/reset-password', { token, password: 'lantern-quay-spur-gear-64' })).status).toBe(200);
    expect((await signIn(user.email, 'lantern-quay-spur-gear-64')).status).toBe(200);
  });

  it('stores no typed address: rows are keyed by the SHA-256 of the normalised address', async () => {
    const email = `keyed-${crypto.randomBytes(4).toString('hex')}@tidewater.test`;
    await signIn(email, wrong);
    const rows: Array<{ email_key: string; attempts: number }> = await t.db.dataSource.query('SELECT email_key, attempts FROM sign_in_attempts');
    expect(rows.every((r) => /^[0-9a-f]{64}$/.test(r.email_key))).toBe(true);
    // node:crypto as the independent SHA-256.
    expect(rows.find((r) => r.email_key === crypto.createHash('sha256').update(email).digest('hex'))?.attempts).toBe(1);
  });
});
