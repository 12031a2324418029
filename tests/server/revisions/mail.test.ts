import net from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp, type TestClient } from '../../setup/test-app';
import { createUser, signedInClient } from '../../factories/user';
import { createDraftGuide } from '../../factories/guide';
import { startMailCatcher } from '../../../server/lib/mail-catcher';
import type { UserEntity } from '../../../server/modules/auth/user.entity';

describe('mail from POST /api/revisions/:id/submit and POST /api/reviews/:revisionId/publish|return', () => {
  let t: TestApp;
  let author: TestClient;
  let authorUser: UserEntity;
  let mod: TestClient;
  let modUser: UserEntity;
  let admin: UserEntity;

  beforeAll(async () => {
    t = await createTestApp();
    ({ client: author, user: authorUser } = await signedInClient(t, 'member'));
    ({ client: mod, user: modUser } = await signedInClient(t, 'moderator'));
    ({ user: admin } = await createUser(t, { role: 'admin' }));
  });
  afterAll(async () => {
    await t.close();
  });

  const outboxTo = async (to: string): Promise<Array<{ subject: string }>> => t.db.dataSource.query('SELECT subject FROM outbox WHERE to_address = $1', [to]);

  it('POST /api/revisions/:id/submit tells every moderator and admin, never the author', async () => {
    const { user: disabledMod } = await createUser(t, { role: 'moderator', disabled: true });
    const { revision } = await createDraftGuide(author, { title: 'Short course on Saltings loose dirt' });
    expect((await author.post(`/api/revisions/${revision.id}/submit`, { note: 'New guide for the loose dirt' })).status).toBe(200);
    const toMod = await t.waitForMail(modUser.email, /waiting for review/i);
    expect(toMod.subject).toBe('Waiting for review: Short course on Saltings loose dirt (version 1)');
    expect(toMod.text).toContain('New guide for the loose dirt');
    // The client's review page for it (src/app/router.tsx: review/:revisionId).
    expect(toMod.text).toContain(`/review/${revision.id}`);
    expect(toMod.html).toContain('Short course on Saltings loose dirt');
    await t.waitForMail(admin.email, /waiting for review/i);
    expect(await outboxTo(authorUser.email)).toEqual([]);
    expect(await outboxTo(disabledMod.email)).toEqual([]);
  });

  it('a moderator who submits is not told about their own proposal', async () => {
    const { client: writingMod, user: writingModUser } = await signedInClient(t, 'moderator');
    const { revision } = await createDraftGuide(writingMod, { title: 'Moderator’s own touring guide' });
    await writingMod.post(`/api/revisions/${revision.id}/submit`, { note: 'My guide' });
    await t.waitForMail(modUser.email, /Moderator’s own touring guide/);
    expect(await outboxTo(writingModUser.email)).toEqual([]);
  });

  it('POST /api/reviews/:revisionId/publish tells the author', async () => {
    const { revision } = await createDraftGuide(author, { title: 'Oval pan car, carpet, gearing notes' });
    await author.post(`/api/revisions/${revision.id}/submit`, { note: 'Ready' });
    await mod.post(`/api/reviews/${revision.id}/publish`);
    const mail = await t.waitForMail(authorUser.email, /now live/i);
    expect(mail.subject).toBe('Now live: Oval pan car, carpet, gearing notes (version 1)');
    expect(mail.text).toContain(modUser.displayName);
    expect(mail.text).toMatch(/\/guides\/oval-pan-car-carpet-gearing-notes\/v\/1/);
  });

  it('POST /api/reviews/:revisionId/return tells the author with the reason', async () => {
    const { revision } = await createDraftGuide(author, { title: 'Drag car launch on asphalt' });
    await author.post(`/api/revisions/${revision.id}/submit`, { note: 'Ready' });
    await mod.post(`/api/reviews/${revision.id}/return`, { reason: 'Say which pack you ran & add the <cutoff> caution.' });
    const mail = await t.waitForMail(authorUser.email, /sent back/i);
    expect(mail.subject).toBe('Sent back for changes: Drag car launch on asphalt (version 1)');
    expect(mail.text).toContain('Say which pack you ran & add the <cutoff> caution.');
    // The link opens the author's editor on this revision (a new guide: the new-guide editor).
    expect(mail.text).toContain(`/guides/new?draft=${revision.id}`);
    // The reason is escaped in the HTML part, never markup.
    expect(mail.html).toContain('Say which pack you ran &amp; add the &lt;cutoff&gt; caution.');
  });
});

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const port = (s.address() as net.AddressInfo).port;
      s.close(() => resolve(port));
    });
  });
}

describe('POST /api/revisions/:id/submit while the mail server is down', () => {
  let t: TestApp;
  let port: number;
  let catcher: { close: () => Promise<void> } | null = null;

  beforeAll(async () => {
    port = await freePort();
    t = await createTestApp({ SMTP_URL: `smtp://127.0.0.1:${port}` }, { catcher: false });
  });
  afterAll(async () => {
    await catcher?.close();
    await t.close();
  });

  it('POST /api/revisions/:id/submit succeeds, the mail stays in the outbox, and is delivered once the server is back', async () => {
    const { user: modUser } = await createUser(t, { role: 'moderator' });
    const { client: author } = await signedInClient(t, 'member');
    const { revision } = await createDraftGuide(author, { title: 'Crawler rock garden, slow speed' });
    const res = await author.post(`/api/revisions/${revision.id}/submit`, { note: 'Ready while the mail server is down' });
    expect(res.status).toBe(200);
    expect(res.body.data.revision.state).toBe('in_review');

    await t.mailer.deliverPending();
    const [row] = await t.db.dataSource.query('SELECT id, attempts, sent_at, last_error FROM outbox WHERE to_address = $1', [modUser.email]);
    expect(row.sent_at).toBeNull();
    expect(row.attempts).toBeGreaterThan(0);
    expect(row.last_error).toBeTruthy();

    catcher = await startMailCatcher({ dataSource: t.db.dataSource, port });
    // Skip the back-off wait: make the retry due now, as it would be a few seconds later.
    await t.db.dataSource.query('UPDATE outbox SET next_attempt_at = now() WHERE id = $1', [row.id]);
    expect(await t.mailer.deliverPending()).toBeGreaterThanOrEqual(1);
    const [after] = await t.db.dataSource.query('SELECT sent_at FROM outbox WHERE id = $1', [row.id]);
    expect(after.sent_at).not.toBeNull();
    const captured = await t.db.dataSource.query('SELECT subject FROM captured_mail WHERE to_address = $1', [modUser.email]);
    expect(captured).toEqual([{ subject: 'Waiting for review: Crawler rock garden, slow speed (version 1)' }]);
  });
});
