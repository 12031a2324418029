import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seed } from '../../server/db/seed';
import { DEMO_RUN_PREFIX, seedDemoRuns } from '../../server/modules/runs/demo-seed';
import { createClient, createTestApp, type TestApp } from '../setup/test-app';

let t: TestApp;

beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  await seed(t.db.dataSource, { demo: true, bcryptCost: 4, runs: { storage: t.ctx.storage, logger: t.ctx.logger } });
});
afterAll(async () => {
  await t?.close();
});

describe('GET /api/guides/:slug/evidence (demo seed)', () => {
  it('every live demo guide with a baseline shows one invented, clearly marked run', async () => {
    const guides: Array<{ slug: string }> = await t.db.dataSource.query(
      `SELECT d.slug FROM documents d JOIN revisions r ON r.id = d.published_revision_id WHERE d.kind = 'guide' AND r.setup IS NOT NULL ORDER BY d.slug`,
    );
    expect(guides.length).toBeGreaterThan(0);
    const visitor = createClient(t.app);
    for (const { slug } of guides) {
      const res = await visitor.get(`/api/guides/${slug}/evidence`);
      expect(res.status, slug).toBe(200);
      expect(res.body.data, slug).toHaveLength(1);
      const run = res.body.data[0];
      expect(run.demo).toBe(true);
      expect(run.title.startsWith(DEMO_RUN_PREFIX)).toBe(true);
      expect(run.summary.topSpeedKmh).toBeGreaterThan(0);
      const detail = await visitor.get(`/api/runs/${run.id}`);
      expect(detail.status).toBe(200);
      expect(detail.body.data.importNotes[0].code).toBe('demo');
    }
  });

  it('is idempotent: seeding again makes no second run', async () => {
    const before = Number((await t.db.dataSource.query('SELECT count(*)::int AS n FROM runs'))[0].n);
    expect(await seedDemoRuns(t.db.dataSource, t.ctx.storage, t.ctx.logger)).toBe(0);
    await seed(t.db.dataSource, { demo: true, bcryptCost: 4, runs: { storage: t.ctx.storage, logger: t.ctx.logger } });
    expect(Number((await t.db.dataSource.query('SELECT count(*)::int AS n FROM runs'))[0].n)).toBe(before);
  });
});
