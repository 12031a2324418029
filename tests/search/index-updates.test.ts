import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seed } from '../../server/db/seed';
import { notifyDocumentChanged } from '../../server/lib/document-events';
import { DocumentEntity } from '../../server/modules/revisions/document.entity';
import { createClient, createTestApp, type TestApp } from '../setup/test-app';
import { proposeRevision, publishRevision, setHidden } from '../factories/revision';
import { within } from './wait';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  await seed(t.db.dataSource, { demo: true, bcryptCost: 4 });
  await t.ctx.search.build();
});
afterAll(async () => {
  await t.close();
});

const slugsFor = (app: TestApp, q: string) =>
  app.ctx.search
    .search(q, {}, 50)
    .hits.filter((h) => h.exact)
    .map((h) => `${h.type}:${h.slug}`);
const GUIDE = 'stock-touring-carpet-zero-timing';

describe('search index follows live content', () => {
  it('finds a published edit by its new words and no longer by its old ones, without a rebuild', async () => {
    // "caliper" and "lengthened" appear only in this guide's live text.
    expect(slugsFor(t, 'caliper')).toEqual([`guide:${GUIDE}`]);
    expect(slugsFor(t, 'lengthened')).toEqual([`guide:${GUIDE}`]);
    const build = t.ctx.search.build;
    let rebuilt = 0;
    t.ctx.search.build = async () => {
      rebuilt++;
      return build();
    };
    await publishRevision(t.db.dataSource, 'guide', GUIDE, (c) => ({
      ...c,
      title: 'Stock touring on the Kestrelmoor felt',
      summary: 'A felt-carpet baseline for the spring kestrelmoor series.',
      body: 'Run a gentler punch on the new felt.\n',
    }));
    await within(1000, () => slugsFor(t, 'kestrelmoor').includes(`guide:${GUIDE}`), 'new text findable');
    expect(slugsFor(t, 'caliper')).toEqual([]);
    expect(slugsFor(t, 'lengthened')).toEqual([]);
    expect(t.ctx.search.search('kestrelmoor').hits[0].title).toBe('Stock touring on the Kestrelmoor felt');
    expect(rebuilt).toBe(0);
    t.ctx.search.build = build;
  });

  it('follows a restore (an old text published again)', async () => {
    await publishRevision(
      t.db.dataSource,
      'guide',
      GUIDE,
      (c) => ({ ...c, title: 'Stock touring on carpet, restored', summary: 'The winter baseline again.', body: 'Back to the winter marshwick notes.\n' }),
      { action: 'restored' },
    );
    await within(1000, () => slugsFor(t, 'marshwick').includes(`guide:${GUIDE}`), 'restored text findable');
    expect(slugsFor(t, 'kestrelmoor')).not.toContain(`guide:${GUIDE}`);
  });

  it('drops a hidden document and brings it back when unhidden', async () => {
    await setHidden(t.db.dataSource, 'parameter', 'drag-brake', true);
    await within(1000, () => !t.ctx.search.search('drag brake').hits.some((h) => h.slug === 'drag-brake'), 'hidden parameter gone');
    expect(t.ctx.search.suggest('drag br').some((s) => s.slug === 'drag-brake')).toBe(false);
    const res = await createClient(t.app).get('/api/search?q=dragbreak');
    expect(res.body.data.hits.some((h: { slug: string }) => h.slug === 'drag-brake')).toBe(false);
    await setHidden(t.db.dataSource, 'parameter', 'drag-brake', false);
    await within(1000, () => t.ctx.search.search('dragbreak').hits[0]?.slug === 'drag-brake', 'unhidden parameter back first');
  });

  it('a parameter edit updates its synonyms too', async () => {
    await publishRevision(t.db.dataSource, 'parameter', 'soft-start', (c) => ({ ...c, aliases: [...(c.aliases as string[]), 'gentle launch'] }));
    await within(1000, () => t.ctx.search.search('gentle launch').hits[0]?.slug === 'soft-start', 'new alias ranks the parameter first');
  });

  it('never indexes drafts or proposals, even when a notification arrives for the document', async () => {
    await proposeRevision(t.db.dataSource, 'guide', 'oval-pan-car-carpet', (c) => ({ ...c, body: 'Secret zephyrquill gearing.\n' }), 'in_review');
    await proposeRevision(
      t.db.dataSource,
      'parameter',
      'rollout',
      (c) => ({ ...c, summary: 'A draft about zephyrquill rollout that nobody has reviewed.' }),
      'draft',
    );
    const doc = await t.db.dataSource.getRepository(DocumentEntity).findOneByOrFail({ kind: 'guide', slug: 'oval-pan-car-carpet' });
    await t.db.dataSource.transaction((m) => notifyDocumentChanged(m, { kind: 'guide', documentId: doc.id, slug: doc.slug, action: 'published' }));
    // Wait for that notification to be handled: a later edit of another document shows up only after it.
    await publishRevision(t.db.dataSource, 'guide', 'drag-car-park-asphalt', (c) => ({ ...c, body: `${c.body as string}\nMarker: wrenfold.\n` }));
    await within(1000, () => slugsFor(t, 'wrenfold').length > 0, 'marker edit applied');
    expect(t.ctx.search.search('zephyrquill').total).toBe(0);
    expect(t.ctx.search.search('oval pan car').hits.some((h) => h.slug === 'oval-pan-car-carpet')).toBe(true);
    // The seeded proposal for the 1/8 buggy (its "August meeting" section) is not live either.
    const eighth = t.ctx.search.search('August meeting 187', { type: 'guide' }, 50).hits.find((h) => h.slug === 'eighth-e-buggy-saltings-meadow');
    expect(eighth?.snippet ?? '').not.toMatch(/August/);
  });

  it('indexes a live guide baseline as a setup result, and drops it with its guide', async () => {
    const setup = {
      schemaVersion: 1,
      vehicle: { name: 'Heronbrook test buggy', class: 'buggy-2wd-stock' },
      esc: { 'drag-brake': { value: 12, unit: '%' }, 'throttle-punch': { value: 4, unit: '' } },
      notes: 'Baseline from the quillfeather test day.',
    };
    await publishRevision(t.db.dataSource, 'guide', 'stock-2wd-buggy-harbour-flats-clay', (c) => c, { setup });
    await within(1000, () => t.ctx.search.search('quillfeather').hits.some((h) => h.type === 'setup'), 'setup findable');
    const hit = t.ctx.search.search('quillfeather', { type: 'setup' }).hits[0];
    expect(hit).toMatchObject({ type: 'setup', slug: 'stock-2wd-buggy-harbour-flats-clay', url: '/guides/stock-2wd-buggy-harbour-flats-clay#setup' });
    expect(t.ctx.search.search('quillfeather', { parameter: 'throttle-punch' }).total).toBe(1);
    await setHidden(t.db.dataSource, 'guide', 'stock-2wd-buggy-harbour-flats-clay', true);
    await within(1000, () => t.ctx.search.search('quillfeather').total === 0, 'setup gone with its guide');
  });
});

describe('several app instances on one database', () => {
  it('a change published through one instance is found through the other within one second', async () => {
    const other = await createTestApp({}, { catcher: false, db: t.db });
    try {
      expect(other.ctx.search).not.toBe(t.ctx.search);
      expect(slugsFor(other, 'kestrelmoor')).toEqual(slugsFor(t, 'kestrelmoor'));
      // Publish through instance A's connection pool; instance B only hears NOTIFY.
      await publishRevision(t.ctx.dataSource, 'parameter', 'rev-limit', (c) => ({
        ...c,
        summary: 'Caps motor speed; the ospreyline rule at the club sets it for novices.',
      }));
      const ms = await within(1000, () => slugsFor(other, 'ospreyline').includes('parameter:rev-limit'), 'instance B current');
      await within(1000, () => slugsFor(t, 'ospreyline').includes('parameter:rev-limit'), 'instance A current');
      console.log(`second instance current after ${ms.toFixed(0)} ms`);
    } finally {
      await other.close();
    }
  });

  it('a listener that loses its connection reconnects and catches up', async () => {
    // Kill the listener's backend, as a PostgreSQL restart would; changes made meanwhile must still arrive.
    await t.db.dataSource.query(
      `SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE application_name = 'tunewright-document-listener' AND datname = current_database()`,
    );
    await publishRevision(t.db.dataSource, 'parameter', 'rollout', (c) => ({
      ...c,
      summary: 'Distance per motor turn; the plovercrest sheet lists it per pinion.',
    }));
    await within(5000, () => slugsFor(t, 'plovercrest').includes('parameter:rollout'), 'caught up after reconnect');
  });
});
