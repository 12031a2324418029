import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import pg from 'pg';
import { createClient, createTestApp, type TestApp } from '../../setup/test-app';
import { createUser, signedInClient } from '../../factories/user';
import { createPublishedGuide, proposeEdit } from '../../factories/guide';
import { createDocumentListener } from '../../../server/lib/document-listener';
import { DOCUMENT_CHANNEL, type DocumentChange } from '../../../server/lib/document-events';
import { createPublishedCache, publishedCache } from '../../../server/modules/revisions/read-cache';
import { revisionService } from '../../../server/modules/revisions/service';
import { presentUser } from '../../../server/modules/auth/presenter';
import type { AppContext } from '../../../server/context';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
});
afterAll(async () => {
  await t.close();
});

async function until(check: () => boolean | Promise<boolean>, timeoutMs = 5000) {
  const deadline = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > deadline) throw new Error('condition not met in time');
    await new Promise((r) => setTimeout(r, 25));
  }
}

const change = (slug: string): DocumentChange => ({ kind: 'guide', documentId: '00000000-0000-4000-8000-000000000001', slug, action: 'published' });

describe('document listener', () => {
  it('hears a change only once the sending transaction commits', async () => {
    const heard: DocumentChange[] = [];
    const off = t.ctx.documentListener.onDocumentChanged((c) => heard.push(c));
    const q = t.db.dataSource.createQueryRunner();
    await q.connect();
    await q.startTransaction();
    await q.query('SELECT pg_notify($1, $2)', [DOCUMENT_CHANNEL, JSON.stringify(change('committed-later'))]);
    await new Promise((r) => setTimeout(r, 200));
    expect(heard).toEqual([]);
    await q.commitTransaction();
    await q.release();
    await until(() => heard.length === 1);
    expect(heard[0]).toEqual(change('committed-later'));
    off();
  });

  it('reconnects after its connection is killed (as when PostgreSQL restarts) and keeps fanning out', async () => {
    // Its own connection name, so only this listener is cut off (the app's own keeps listening).
    const listener = createDocumentListener({
      connectionString: t.db.url,
      logger: t.ctx.logger,
      minRetryMs: 50,
      maxRetryMs: 200,
      applicationName: 'tw-listener-under-test',
    });
    const heard: string[] = [];
    let reconnects = 0;
    listener.onDocumentChanged((c) => heard.push(c.slug));
    listener.onReconnected(() => reconnects++);
    await listener.start();
    expect(listener.listening).toBe(true);

    const admin = new pg.Client({ connectionString: t.db.url });
    await admin.connect();
    try {
      const killed = await admin.query(
        `SELECT pg_terminate_backend(pid) AS ok FROM pg_stat_activity WHERE application_name = 'tw-listener-under-test' AND datname = current_database()`,
      );
      expect(killed.rows.length).toBeGreaterThanOrEqual(1);
      await until(() => reconnects >= 1);
      expect(listener.listening).toBe(true);
      await admin.query('SELECT pg_notify($1, $2)', [DOCUMENT_CHANNEL, JSON.stringify(change('after-reconnect'))]);
      await until(() => heard.includes('after-reconnect'));
      // Malformed payloads are ignored, not passed on.
      await admin.query('SELECT pg_notify($1, $2)', [DOCUMENT_CHANNEL, '{"kind":"poem"}']);
      await admin.query('SELECT pg_notify($1, $2)', [DOCUMENT_CHANNEL, JSON.stringify(change('after-malformed'))]);
      await until(() => heard.includes('after-malformed'));
      expect(heard).toEqual(['after-reconnect', 'after-malformed']);
    } finally {
      await admin.end();
      await listener.close();
    }
    expect(listener.listening).toBe(false);
  });
});

describe('GET /api/guides/:slug (reading cache across instances)', () => {
  it('drops the cached page when another app instance publishes (via NOTIFY)', async () => {
    const { client: author } = await signedInClient(t, 'member');
    const { client: mod } = await signedInClient(t, 'moderator');
    const { user: otherMod } = await createUser(t, { role: 'moderator' });
    const heard = new Set<string>();
    const off = t.ctx.documentListener.onDocumentChanged((c) => heard.add(c.slug));
    const { slug } = await createPublishedGuide(author, mod, { summary: 'Version one summary for the cache check.' });
    // This instance hears its own publish too (a second, harmless invalidation): let it pass before caching.
    await until(() => heard.has(slug));
    off();
    const visitor = createClient(t.app);
    await visitor.get(`/api/guides/${slug}`).expect(200);
    expect(publishedCache(t.ctx).size).toBeGreaterThan(0);
    const edit = await proposeEdit(author, slug, { summary: 'Version two summary for the cache check.' });
    expect((await author.post(`/api/revisions/${edit.id}/submit`, { note: 'Second version' })).status).toBe(200);

    // A second instance: same database, its own listener and cache.
    const listener2 = createDocumentListener({ connectionString: t.db.url, logger: t.ctx.logger });
    await listener2.start();
    const ctx2: AppContext = { ...t.ctx, documentListener: listener2 };
    try {
      await revisionService(ctx2).publish(presentUser(otherMod), edit.id);
    } finally {
      await listener2.close();
    }
    await until(async () => (await visitor.get(`/api/guides/${slug}`)).body.data.guide.version === 2);
    expect((await visitor.get(`/api/guides/${slug}`)).body.data.guide.summary).toBe('Version two summary for the cache check.');
  });
});

describe('published cache', () => {
  it('serves a stored value, and never stores one whose load overlapped an invalidation', async () => {
    const cache = createPublishedCache();
    let loads = 0;
    const load = async () => ({ n: ++loads });
    expect(await cache.read('v', 'guide', 'a', load)).toEqual({ n: 1 });
    expect(await cache.read('v', 'guide', 'a', load)).toEqual({ n: 1 });
    cache.invalidate('guide', 'a');
    expect(await cache.read('v', 'guide', 'a', load)).toEqual({ n: 2 });

    let release!: () => void;
    const slow = () => new Promise<{ n: number }>((resolve) => (release = () => resolve({ n: 99 })));
    cache.invalidate('guide', 'b');
    const pending = cache.read('v', 'guide', 'b', slow);
    cache.invalidate('guide', 'b');
    release();
    expect(await pending).toEqual({ n: 99 });
    expect(await cache.read('v', 'guide', 'b', load)).toEqual({ n: 3 });
    expect(await cache.read('v', 'guide', 'missing', async () => null)).toBeNull();
    expect(cache.size).toBe(2);
  });

  it('drops views spanning many documents when any document changes', async () => {
    const cache = createPublishedCache();
    let loads = 0;
    const load = async () => ++loads;
    expect(await cache.readAcross('parameter-library', load)).toBe(1);
    expect(await cache.readAcross('parameter-library', load)).toBe(1);
    expect(await cache.read('guide-detail', 'guide', 'a', load)).toBe(2);
    cache.invalidate('guide', 'some-other-guide');
    expect(await cache.readAcross('parameter-library', load)).toBe(3);
    // A per-document view of an unrelated document survives.
    expect(await cache.read('guide-detail', 'guide', 'a', load)).toBe(2);
  });

  it('reads through while disabled (listener down)', async () => {
    let on = false;
    const cache = createPublishedCache({ enabled: () => on });
    let loads = 0;
    const load = async () => ++loads;
    await cache.read('v', 'guide', 'a', load);
    await cache.read('v', 'guide', 'a', load);
    expect(loads).toBe(2);
    on = true;
    await cache.read('v', 'guide', 'a', load);
    await cache.read('v', 'guide', 'a', load);
    expect(loads).toBe(3);
  });
});
