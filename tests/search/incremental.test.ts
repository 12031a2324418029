import { describe, expect, it } from 'vitest';
import { SearchIndex, type SearchDocument } from '../../server/modules/search/search-index';
import { rng, syntheticGuides } from '../bench/search-corpus';
import { libraryDocuments } from './library-index';

// An index kept current item by item (updated postings appended to the cached lists, not rebuilt)
// must answer like an index built afresh from the same items: the same matches, totals and facets,
// snippets from the new text. Scores are not compared with the fresh index: idf counts the postings
// of replaced items until MiniSearch vacuums them, so they drift (as they did when an update rebuilt
// the list); the second test holds the scores exactly instead.

const QUERIES = ['drag brake', 'dragbreak', 'punch', 'clay', 'harbour flats', 'quillfeather', 'brake strength carpet', 'dust', '17.5T', 'quill'];

/** Every match of a query, by item (limit past any total here), so a near-tie ordered differently at the page edge does not matter. */
function byItem(index: SearchIndex, q: string) {
  const r = index.search(q, {}, 5000);
  return { total: r.total, facets: r.facets, hits: new Map(r.hits.map((h) => [`${h.type}:${h.slug}`, h])) };
}

describe('SearchIndex updates', () => {
  it('answers after updates as a freshly built index does, reading cached postings first', () => {
    const r = rng(11);
    const items: SearchDocument[] = [...libraryDocuments(), ...syntheticGuides(400)];
    const live = new SearchIndex();
    live.load(items);
    // Fill the postings cache for every query's terms, so the updates below patch cached lists.
    for (const q of QUERIES) live.search(q, {}, 50);
    const current = new Map(items.map((d) => [`${d.type}:${d.slug}`, d]));
    for (let i = 0; i < 120; i++) {
      const d = items[Math.floor(r() * items.length)];
      const key = `${d.type}:${d.slug}`;
      if (i % 7 === 3) {
        live.remove(d.type, d.slug);
        current.delete(key);
        continue;
      }
      const edited = { ...d, body: `${d.body} Quillfeather note ${i}: ${i % 2 ? 'lower the drag brake on dusty clay' : 'more punch'}.` };
      live.put(edited);
      current.set(key, edited);
      if (i % 10 === 0) live.search(QUERIES[i % QUERIES.length], {}, 50);
    }
    const fresh = new SearchIndex();
    fresh.load([...current.values()]);
    for (const q of QUERIES) {
      const a = byItem(live, q);
      const b = byItem(fresh, q);
      expect(a.total, q).toBe(b.total);
      expect(a.facets, q).toEqual(b.facets);
      expect([...a.hits.keys()].sort(), q).toEqual([...b.hits.keys()].sort());
      for (const [key, h] of a.hits) {
        const want = b.hits.get(key)!;
        expect({ snippet: h.snippet, exact: h.exact }, `${q}: ${key}`).toEqual({ snippet: want.snippet, exact: want.exact });
      }
    }
    // The edits are findable by their new words, and removed items are gone.
    expect(live.search('quillfeather', {}, 50).total).toBe([...current.values()].filter((d) => /Quillfeather/.test(d.body)).length);
  });

  it('re-adding unchanged items leaves every answer exactly as it was (no item counted twice or lost)', () => {
    const items: SearchDocument[] = [...libraryDocuments(), ...syntheticGuides(300)];
    const index = new SearchIndex();
    index.load(items);
    const before = new Map(QUERIES.map((q) => [q, byItem(index, q)]));
    const r = rng(5);
    for (let i = 0; i < 80; i++) index.put({ ...items[Math.floor(r() * items.length)] });
    for (const q of QUERIES) {
      const a = byItem(index, q);
      const b = before.get(q)!;
      expect(a.total, q).toBe(b.total);
      expect(a.facets, q).toEqual(b.facets);
      expect(Object.fromEntries(a.hits), q).toEqual(Object.fromEntries(b.hits));
    }
  });
});
