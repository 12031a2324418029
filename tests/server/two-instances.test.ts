import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { routeTable } from '../../server/routes';
import { seed } from '../../server/db/seed';
import { createTestDatabase, type TestDatabase } from '../setup/test-db';
import { startAppProcess, type AppProcess } from '../setup/app-process';
import { httpClient, type HttpClient } from '../setup/http-client';
import { insertAccounts } from '../setup/accounts';
import { createGuideDraft, expectOk, missingGuideSteps, proposeGuideEdit, publishRevision, readGuide, submitDraft } from '../setup/guide-flow';

// Scale-out in small: two app processes (the real entry point, production mode behind a TLS proxy)
// on one database. Sessions, CSRF tokens and data written through one are seen through the other.
let db: TestDatabase;
let a: AppProcess;
let b: AppProcess;
const uploads = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-two-uploads-'));
const viaProxy = { headers: { 'X-Forwarded-Proto': 'https' } };

beforeAll(async () => {
  db = await createTestDatabase();
  await seed(db.dataSource, { demo: true, bcryptCost: 4 });
  const env = {
    NODE_ENV: 'production',
    DATABASE_URL: db.url,
    SESSION_SECRET: crypto.randomBytes(24).toString('hex'),
    TRUST_PROXY: 'true',
    LOG_LEVEL: 'error',
    BCRYPT_COST: '4',
    RATE_LIMIT_AUTH_PER_15MIN: '10000',
    SMTP_URL: 'smtp://127.0.0.1:1',
    UPLOAD_DIR: uploads,
  };
  [a, b] = await Promise.all([startAppProcess(env), startAppProcess(env)]);
}, 90_000);

afterAll(async () => {
  await Promise.all([a?.stop(), b?.stop()]);
  await db?.drop();
  fs.rmSync(uploads, { recursive: true, force: true });
});

const meId = async (c: HttpClient) => (await c.get('/api/auth/me')).body as { data: { user: { id: string; displayName: string } | null } };

describe('two app instances on one database', () => {
  it('a session and CSRF token from instance A work on instance B, and a write through B reads back through A', async () => {
    const [member] = await insertAccounts(db.dataSource, 'member', 1, 'two-a');
    const client = httpClient(a.baseUrl, viaProxy);
    await client.signIn(member.email, member.password);
    const token = await client.csrf();
    client.useBaseUrl(b.baseUrl);
    expect((await meId(client)).data.user?.id).toBe(member.id);
    const res = await client.patch('/api/account', { displayName: 'Written Through B' }, { csrf: token });
    expect(res.status, res.text).toBe(200);
    client.useBaseUrl(a.baseUrl);
    expect((await meId(client)).data.user?.displayName).toBe('Written Through B');
  });

  it('serves a few hundred mixed requests across both with no 5xx and no socket errors; the last write wins everywhere', async () => {
    const workers = 8;
    const rounds = 20;
    const members = await insertAccounts(db.dataSource, 'member', workers, 'two-w');
    const publicReads = routeTable
      .filter((r) => r.method === 'get' && r.access === 'public' && !r.devOnly && !r.path.includes(':') && !r.download)
      .map((r) => r.path);
    const statuses = new Map<number, number>();
    const failures: string[] = [];
    const count = (s: number) => statuses.set(s, (statuses.get(s) ?? 0) + 1);
    await Promise.all(
      members.map(async (m, w) => {
        const client = httpClient(a.baseUrl, viaProxy);
        await client.signIn(m.email, m.password);
        for (let i = 0; i < rounds; i++) {
          client.useBaseUrl(i % 2 ? b.baseUrl : a.baseUrl);
          try {
            const read = await client.get(publicReads[(w + i) % publicReads.length]);
            count(read.status);
            const write = await client.patch('/api/account', { displayName: `Worker ${w} round ${i}` });
            count(write.status);
            if (write.status !== 200) failures.push(`write ${w}/${i}: ${write.status} ${write.text.slice(0, 120)}`);
          } catch (err) {
            failures.push(`socket ${w}/${i}: ${(err as Error).message}`);
          }
        }
      }),
    );
    const total = [...statuses.values()].reduce((x, y) => x + y, 0);
    console.log(`two instances: ${total} requests, statuses ${JSON.stringify(Object.fromEntries(statuses))}`);
    expect(failures).toEqual([]);
    expect(total).toBe(workers * rounds * 2);
    expect([...statuses.keys()].filter((s) => s >= 500)).toEqual([]);
    // Both instances and the database agree on every account's last write.
    for (const [w, m] of members.entries()) {
      const [row] = await db.dataSource.query(`SELECT display_name FROM users WHERE id = $1`, [m.id]);
      expect(row.display_name).toBe(`Worker ${w} round ${rounds - 1}`);
    }
    const probe = httpClient(b.baseUrl, viaProxy);
    await probe.signIn(members[0].email, members[0].password);
    expect((await meId(probe)).data.user?.displayName).toBe(`Worker 0 round ${rounds - 1}`);
    probe.useBaseUrl(a.baseUrl);
    expect((await meId(probe)).data.user?.displayName).toBe(`Worker 0 round ${rounds - 1}`);
  }, 90_000);

  const missing = missingGuideSteps(routeTable, ['create', 'submit', 'publish', 'read', 'propose']);
  it.skipIf(missing.length > 0)(
    `a guide published through A is read at its new version through B (needs: ${missing.join(', ') || 'all present'})`,
    async () => {
      const [author] = await insertAccounts(db.dataSource, 'member', 1, 'two-author');
      const [moderator] = await insertAccounts(db.dataSource, 'moderator', 1, 'two-mod');
      const writer = httpClient(a.baseUrl, viaProxy);
      await writer.signIn(author.email, author.password);
      const mod = httpClient(a.baseUrl, viaProxy);
      await mod.signIn(moderator.email, moderator.password);
      const reader = httpClient(b.baseUrl, viaProxy);

      const draft = await createGuideDraft(writer, 'two-instances');
      expectOk(await submitDraft(writer, draft.revisionId, 'First version for the club night'), 'submit v1');
      expectOk(await publishRevision(mod, draft.revisionId), 'publish v1');
      const v1 = await readGuide(reader, draft.slug);
      expect(v1.status, v1.text).toBe(200);
      expect(v1.text).toContain(draft.content.title);

      const edit = expectOk(await proposeGuideEdit(writer, draft.slug, draft.revisionId, { title: 'Harbour Flats clay baseline, second take' }), 'propose v2');
      expectOk(await submitDraft(writer, edit.data.revision.id, 'Retitled after the second club night'), 'submit v2');
      const published = Date.now();
      expectOk(await publishRevision(mod, edit.data.revision.id), 'publish v2');
      // B had v1 in hand (and maybe cached); it must serve v2 soon after the publish committed.
      let lagMs = -1;
      while (Date.now() - published < 3000) {
        const now = await readGuide(reader, draft.slug);
        if (now.text.includes('second take')) {
          lagMs = Date.now() - published;
          break;
        }
        await new Promise((r) => setTimeout(r, 50));
      }
      console.log(`two instances: the new version reached the other instance after ${lagMs} ms`);
      expect(lagMs).toBeGreaterThanOrEqual(0);
    },
    60_000,
  );
});
