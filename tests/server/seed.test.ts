import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../setup/test-app';
import { seed } from '../../server/db/seed';
import { readGuideDirs, readParameterFiles } from '../../server/db/seed-content';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
});
afterAll(async () => {
  await t.close();
});

const count = async (sql: string) => Number((await t.db.dataSource.query(sql))[0].n);

describe('seed', () => {
  it('loads the library and demo guides once, and a second run adds nothing', async () => {
    await seed(t.db.dataSource, { demo: true, bcryptCost: 4 });
    const first = {
      users: await count('SELECT count(*) n FROM users'),
      documents: await count('SELECT count(*) n FROM documents'),
      revisions: await count('SELECT count(*) n FROM revisions'),
    };
    await seed(t.db.dataSource, { demo: true, bcryptCost: 4 });
    expect({
      users: await count('SELECT count(*) n FROM users'),
      documents: await count('SELECT count(*) n FROM documents'),
      revisions: await count('SELECT count(*) n FROM revisions'),
    }).toEqual(first);

    const parameters = readParameterFiles();
    expect(parameters.length).toBeGreaterThanOrEqual(24);
    expect(await count(`SELECT count(*) n FROM documents d JOIN revisions r ON r.id = d.published_revision_id WHERE d.kind = 'parameter' AND r.number = 1`)).toBe(parameters.length);

    const guides = readGuideDirs();
    const inReviewFiles = guides.flatMap((g) => g.revisions).filter((r) => r.state === 'in_review').length;
    expect(await count(`SELECT count(*) n FROM revisions WHERE state = 'in_review'`)).toBe(inReviewFiles);
    expect(inReviewFiles).toBeGreaterThanOrEqual(2);
    // Exactly one live revision per guide that has a published file, and it is the newest published one.
    const live = await t.db.dataSource.query(`SELECT d.slug, r.number FROM documents d JOIN revisions r ON r.id = d.published_revision_id WHERE d.kind = 'guide'`);
    for (const g of guides) {
      const newestPublished = g.revisions.filter((r) => r.state === 'published').at(-1);
      const row = live.find((l: { slug: string }) => l.slug === g.slug);
      expect(row?.number, g.slug).toBe(newestPublished?.number);
    }
    expect(await count(`SELECT count(*) n FROM revisions WHERE state = 'archived'`)).toBeGreaterThan(0);
  });
});
