import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seed } from '../../server/db/seed';
import { createTestApp, type TestApp } from '../setup/test-app';
import { QUALITY_QUERIES } from './queries';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  await seed(t.db.dataSource, { demo: true, bcryptCost: 4 });
  await t.ctx.search.build();
});
afterAll(async () => {
  await t.close();
});

describe('search quality over the seeded library', () => {
  it('has the expected page in the top 3 for at least 90 % of realistic queries', () => {
    expect(QUALITY_QUERIES.length).toBeGreaterThanOrEqual(40);
    let top3 = 0;
    let reciprocal = 0;
    const misses: string[] = [];
    for (const { q, expect: want } of QUALITY_QUERIES) {
      const got = t.ctx.search.search(q, {}, 10).hits.map((h) => `${h.type}:${h.slug}`);
      const rank = got.indexOf(want) + 1;
      if (rank >= 1 && rank <= 3) top3++;
      else misses.push(`${q} → wanted ${want}, got ${got.slice(0, 3).join(', ')}`);
      if (rank) reciprocal += 1 / rank;
    }
    const rate = top3 / QUALITY_QUERIES.length;
    const mrr = reciprocal / QUALITY_QUERIES.length;
    console.log(
      `search quality: top-3 hit rate ${(rate * 100).toFixed(1)} % (${top3}/${QUALITY_QUERIES.length}), mean reciprocal rank ${mrr.toFixed(3)}${misses.length ? `\n  misses:\n  ${misses.join('\n  ')}` : ''}`,
    );
    expect(rate).toBeGreaterThanOrEqual(0.9);
  });

  it('every expected page exists in the index (the set does not reward a missing page)', () => {
    for (const { expect: want } of QUALITY_QUERIES) {
      const [type, slug] = want.split(':');
      const found = t.ctx.search.search(slug.replace(/-/g, ' '), { type: type as 'parameter' | 'guide' }, 50).hits.some((h) => h.slug === slug);
      expect(found, want).toBe(true);
    }
  });
});
