import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, createClient, type TestApp, type TestClient } from '../setup/test-app';
import { signedInClient } from '../factories/user';
import { createPublishedGuide, proposeEdit } from '../factories/guide';
import type { UserEntity } from '../../server/modules/auth/user.entity';
import { watchService } from '../../server/modules/watches/service';
import { signUnsubscribe, verifyUnsubscribe } from '../../server/modules/watches/tokens';

describe('watches: PUT/DELETE/GET /api/watches…, mail on live changes, digest and unsubscribe', () => {
  let t: TestApp;
  let author: TestClient;
  let authorUser: UserEntity;
  let mod: TestClient;
  let modUser: UserEntity;
  let reader: TestClient;
  let readerUser: UserEntity;
  let editor: TestClient;

  beforeAll(async () => {
    t = await createTestApp();
    ({ client: author, user: authorUser } = await signedInClient(t, 'member'));
    ({ client: mod, user: modUser } = await signedInClient(t, 'moderator'));
    ({ client: reader, user: readerUser } = await signedInClient(t, 'member'));
    ({ client: editor } = await signedInClient(t, 'member'));
  });
  afterAll(async () => {
    await t.close();
  });

  const outbox = async (to: string): Promise<Array<{ subject: string; text_body: string; headers: Record<string, string> | null }>> =>
    t.db.dataSource.query('SELECT subject, text_body, headers FROM outbox WHERE to_address = $1 ORDER BY created_at', [to]);

  /** Someone else edits the guide and a moderator publishes it; returns the new version's number. */
  async function editGoesLive(slug: string, note: string) {
    const draft = await proposeEdit(editor, slug, { summary: `A firmer baseline for the high-bite night (${note}).` });
    expect((await editor.post(`/api/revisions/${draft.id}/submit`, { note })).status).toBe(200);
    expect((await mod.post(`/api/reviews/${draft.id}/publish`)).status).toBe(200);
    return draft.number;
  }

  it('PUT, GET and DELETE /api/watches/:kind/:slug; GET /api/watches lists mine; the author watches their own', async () => {
    const { slug } = await createPublishedGuide(author, mod, { title: 'Watched stock buggy baseline' });
    expect((await reader.get(`/api/watches/guide/${slug}`)).body.data).toEqual({ kind: 'guide', slug, watching: false });
    const put = await reader.put(`/api/watches/guide/${slug}`);
    expect(put.status).toBe(200);
    expect(put.body.data).toEqual({ kind: 'guide', slug, watching: true });
    // Idempotent.
    expect((await reader.put(`/api/watches/guide/${slug}`)).body.data.watching).toBe(true);
    const mine = await reader.get('/api/watches');
    expect(mine.body.data).toEqual([{ kind: 'guide', slug, title: 'Watched stock buggy baseline', since: expect.any(String) }]);
    expect((await author.get('/api/watches')).body.data.map((w: { slug: string }) => w.slug)).toContain(slug);
    const del = await reader.delete(`/api/watches/guide/${slug}`);
    expect(del.body.data).toEqual({ kind: 'guide', slug, watching: false });
    expect((await reader.get('/api/watches')).body.data).toEqual([]);
  });

  it('answers 401 to visitors, 404 for a guide that does not exist, 400 for an unknown kind', async () => {
    const visitor = createClient(t.app);
    const res = await visitor.put('/api/watches/guide/anything');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
    expect((await visitor.get('/api/watches')).status).toBe(401);
    const none = await reader.put('/api/watches/guide/no-such-guide-here');
    expect(none.status).toBe(404);
    expect(none.body.error.code).toBe('not_found');
    const bad = await reader.put('/api/watches/setup/some-slug');
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('params.kind');
  });

  it('mails a watcher when someone else’s edit goes live: the edit note, a diff link, a signed unsubscribe link and RFC 8058 headers', async () => {
    const { slug } = await createPublishedGuide(author, mod, { title: 'Clay night gearing' });
    await reader.put(`/api/watches/guide/${slug}`);
    const number = await editGoesLive(slug, 'Firmer summary <b>for the night</b>');
    const mail = await t.waitForMail(readerUser.email, /Clay night gearing/);
    expect(mail.subject).toBe(`New version: Clay night gearing (version ${number})`);
    expect(mail.text).toContain('Edit note: Firmer summary <b>for the night</b>');
    // The note is text in the HTML part, never markup.
    expect(mail.html).toContain('Firmer summary &lt;b&gt;for the night&lt;/b&gt;');
    expect(mail.text).toContain(`http://127.0.0.1:3000/guides/${slug}/compare?from=${number - 1}&to=${number}`);
    expect(mail.headers?.['list-unsubscribe-post']).toBe('List-Unsubscribe=One-Click');
    const oneClick = /^<(.+)>$/.exec(mail.headers?.['list-unsubscribe'] ?? '')?.[1];
    expect(oneClick).toMatch(/^http:\/\/127\.0\.0\.1:3000\/unsubscribe\/one-click\?token=/);
    // The author is a watcher too (by default) and is told; the editor has their own "now live" mail instead.
    await t.waitForMail(authorUser.email, /New version: Clay night gearing/);
    expect((await outbox(modUser.email)).filter((m) => m.subject.startsWith('New version'))).toEqual([]);

    // The diff link works for a visitor.
    const diff = await createClient(t.app).get(`/api/guides/${slug}/compare?from=${number - 1}&to=${number}`);
    expect(diff.status).toBe(200);

    // One-click: a POST with no cookie and no CSRF token, as a mail program sends it.
    const url = new URL(oneClick!);
    const res = await request(t.app).post(`${url.pathname}${url.search}`).type('form').send('List-Unsubscribe=One-Click');
    expect(res.status).toBe(200);
    expect((await reader.get(`/api/watches/guide/${slug}`)).body.data.watching).toBe(false);
    const before = (await outbox(readerUser.email)).length;
    await editGoesLive(slug, 'Second change');
    await t.waitForMail(authorUser.email, /Clay night gearing \(version 3\)/);
    expect((await outbox(readerUser.email)).length).toBe(before);
  });

  it('POST /api/unsubscribe takes the page link’s token without a session; an altered token is refused', async () => {
    const { slug } = await createPublishedGuide(author, mod, { title: 'Loose dirt punch' });
    await reader.put(`/api/watches/guide/${slug}`);
    await editGoesLive(slug, 'Punch down a step');
    const mail = await t.waitForMail(readerUser.email, /Loose dirt punch/);
    const pageUrl = /Stop mails about "Loose dirt punch": (\S+)/.exec(mail.text)?.[1];
    expect(pageUrl).toMatch(/^http:\/\/127\.0\.0\.1:3000\/unsubscribe\?token=/);
    const token = new URL(pageUrl!).searchParams.get('token')!;
    const visitor = createClient(t.app);
    const forged = await visitor.post('/api/unsubscribe', { token: token.slice(0, -2) + (token.endsWith('AA') ? 'BB' : 'AA') });
    expect(forged.status).toBe(400);
    expect(forged.body.error.code).toBe('token_invalid');
    expect((await reader.get(`/api/watches/guide/${slug}`)).body.data.watching).toBe(true);
    const ok = await visitor.post('/api/unsubscribe', { token });
    expect(ok.status).toBe(200);
    expect(ok.body.data).toEqual({ scope: 'document', kind: 'guide', slug, title: 'Loose dirt punch' });
    expect((await reader.get(`/api/watches/guide/${slug}`)).body.data.watching).toBe(false);
  });

  it('a token is bound to its payload and secret', () => {
    const token = signUnsubscribe('secret-one', { u: readerUser.id });
    expect(verifyUnsubscribe('secret-one', token)).toEqual({ u: readerUser.id });
    expect(verifyUnsubscribe('secret-two', token)).toBeNull();
    const [, sig] = token.split('.');
    const other = Buffer.from(JSON.stringify({ u: authorUser.id })).toString('base64url');
    expect(verifyUnsubscribe('secret-one', `${other}.${sig}`)).toBeNull();
  });

  it('a daily reader gets one digest after the digest hour with every change, and nothing before', async () => {
    const { client: daily, user: dailyUser } = await signedInClient(t, 'member');
    expect((await daily.put('/api/watches/settings', { delivery: 'daily' })).body.data).toEqual({ delivery: 'daily' });
    expect((await daily.get('/api/watches/settings')).body.data).toEqual({ delivery: 'daily' });
    const { slug } = await createPublishedGuide(author, mod, { title: 'Digest touring guide' });
    await daily.put(`/api/watches/guide/${slug}`);
    await editGoesLive(slug, 'First digest change');
    await editGoesLive(slug, 'Second digest change');
    expect(await outbox(dailyUser.email)).toEqual([]);
    const svc = watchService(t.ctx);
    const later = new Date(Date.now() + 2 * 86_400_000);
    const beforeHour = new Date(Date.UTC(later.getUTCFullYear(), later.getUTCMonth(), later.getUTCDate(), 5, 59));
    const afterHour = new Date(Date.UTC(later.getUTCFullYear(), later.getUTCMonth(), later.getUTCDate(), 6, 1));
    // Before the hour, the digest of the day before is due (none was sent yet).
    expect(await svc.sendDueDigests(beforeHour)).toBe(1);
    expect(await svc.sendDueDigests(afterHour)).toBe(0);
    const mails = await outbox(dailyUser.email);
    expect(mails).toHaveLength(1);
    expect(mails[0].subject).toBe('Today on Tunewright: 2 changes to what you watch');
    expect(mails[0].text_body).toContain('Edit note: First digest change');
    expect(mails[0].text_body).toContain('Edit note: Second digest change');
    expect(mails[0].headers?.['List-Unsubscribe-Post']).toBe('List-Unsubscribe=One-Click');
    // The digest's link turns every watch mail off, and keeps the list.
    const token = new URL(/Stop all mails about what I watch: (\S+)/.exec(mails[0].text_body)![1]).searchParams.get('token')!;
    expect((await createClient(t.app).post('/api/unsubscribe', { token })).body.data.scope).toBe('all');
    expect((await daily.get('/api/watches/settings')).body.data).toEqual({ delivery: 'off' });
    expect((await daily.get('/api/watches')).body.data).toHaveLength(1);
  });

  it('hiding tells the author with the reason, and watchers without it', async () => {
    const { slug } = await createPublishedGuide(author, mod, { title: 'Guide that gets hidden' });
    await reader.put(`/api/watches/guide/${slug}`);
    expect((await mod.post(`/api/guides/${slug}/hide`, { reason: 'Copied text from a printed manual' })).status).toBe(200);
    const notice = await t.waitForMail(authorUser.email, /Taken out of public view: Guide that gets hidden/);
    expect(notice.text).toContain('Copied text from a printed manual');
    const watcher = await t.waitForMail(readerUser.email, /Hidden: Guide that gets hidden/);
    expect(watcher.text).not.toContain('Copied text');
  });
});
