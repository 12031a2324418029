import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../setup/test-app';
import { seed } from '../../server/db/seed';
import { readGuideDirs, readParameterFiles, readParameterHistory } from '../../server/db/seed-content';

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
    // Each entry is live at its newest version file; corrections keep the older versions as history.
    const liveParams: Array<{ slug: string; number: number; note: string }> = await t.db.dataSource.query(
      `SELECT d.slug, r.number, r.note FROM documents d JOIN revisions r ON r.id = d.published_revision_id WHERE d.kind = 'parameter'`,
    );
    expect(liveParams).toHaveLength(parameters.length);
    for (const versions of readParameterHistory()) {
      const newest = versions[versions.length - 1];
      expect(
        liveParams.find((l) => l.slug === newest.slug),
        newest.slug,
      ).toMatchObject({ number: newest.number, note: newest.note });
    }
    expect(readParameterHistory().some((v) => v.length > 1)).toBe(true);

    const guides = readGuideDirs();
    const inReviewFiles = guides.flatMap((g) => g.revisions).filter((r) => r.state === 'in_review').length;
    expect(await count(`SELECT count(*) n FROM revisions WHERE state = 'in_review'`)).toBe(inReviewFiles);
    expect(inReviewFiles).toBeGreaterThanOrEqual(2);
    // Exactly one live revision per guide that has a published file, and it is the newest published one.
    const live = await t.db.dataSource.query(
      `SELECT d.slug, r.number FROM documents d JOIN revisions r ON r.id = d.published_revision_id WHERE d.kind = 'guide'`,
    );
    for (const g of guides) {
      const newestPublished = g.revisions.filter((r) => r.state === 'published').at(-1);
      const row = live.find((l: { slug: string }) => l.slug === g.slug);
      expect(row?.number, g.slug).toBe(newestPublished?.number);
    }
    expect(await count(`SELECT count(*) n FROM revisions WHERE state = 'archived'`)).toBeGreaterThan(0);
  });

  it('appends a correction to an entry that is still as seeded, and leaves an entry moderators edited alone', async () => {
    await seed(t.db.dataSource, { demo: false, bcryptCost: 4 });
    const corrected = readParameterHistory().filter((v) => v.length > 1);
    const [a, b] = corrected.map((v) => v[0].slug);
    // Roll both back to how an older release seeded them (version 1 live), then edit b's version 1 as a moderator would have.
    for (const slug of [a, b]) {
      await t.db.dataSource.query(
        `UPDATE documents d SET published_revision_id = r.id FROM revisions r WHERE r.document_id = d.id AND r.number = 1 AND d.kind = 'parameter' AND d.slug = $1`,
        [slug],
      );
      await t.db.dataSource.query(
        `DELETE FROM revisions r USING documents d WHERE r.document_id = d.id AND d.kind = 'parameter' AND d.slug = $1 AND r.number > 1`,
        [slug],
      );
      await t.db.dataSource.query(`UPDATE revisions r SET state = 'published' FROM documents d WHERE r.document_id = d.id AND d.slug = $1 AND r.number = 1`, [
        slug,
      ]);
    }
    await t.db.dataSource.query(
      `UPDATE revisions r SET content = jsonb_set(r.content, '{summary}', '"Edited by a moderator since."') FROM documents d WHERE r.document_id = d.id AND d.slug = $1`,
      [b],
    );
    await seed(t.db.dataSource, { demo: false, bcryptCost: 4 });
    const states = async (slug: string) =>
      t.db.dataSource.query(
        `SELECT r.number, r.state, (d.published_revision_id = r.id) AS live FROM revisions r JOIN documents d ON d.id = r.document_id WHERE d.slug = $1 ORDER BY r.number`,
        [slug],
      );
    const history = corrected.find((v) => v[0].slug === a)!;
    expect(await states(a)).toEqual(
      history.map((v, i) => ({ number: v.number, state: i === history.length - 1 ? 'published' : 'archived', live: i === history.length - 1 })),
    );
    expect(await states(b)).toEqual([{ number: 1, state: 'published', live: true }]);
  });
});
