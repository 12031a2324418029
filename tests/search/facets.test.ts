import { describe, expect, it } from 'vitest';
import { CLASSES, SURFACES } from '../../shared/constants';
import { SearchIndex, type SearchDocument, type SearchFilters } from '../../server/modules/search/search-index';
import { rng } from '../bench/search-corpus';

// Facet counts and totals, checked against a brute-force count over the same items: the index
// counts them in bit-sliced form over flat arrays, and this keeps that honest through updates.

// More parameter slugs than one 32-bit word holds, and one item that lists more than 40.
const PARAMS = Array.from({ length: 45 }, (_, i) => `invented-setting-${String.fromCharCode(97 + (i % 26))}${Math.floor(i / 26)}`);
const CLASS_SLUGS: Array<string | null> = [null, ...CLASSES.map((c) => c.slug)];
const SURFACE_SLUGS: Array<string | null> = [null, ...SURFACES.map((s) => s.slug)];

function corpus(n: number, seed: number): SearchDocument[] {
  const r = rng(seed);
  const pick = <T>(xs: readonly T[]) => xs[Math.floor(r() * xs.length)];
  return Array.from({ length: n }, (_, i) => {
    const words = ['Notes from the Tidewater club night.'];
    // Query words in different fields and counts, so scores differ but membership is plain.
    if (r() < 0.6) words.push('Spread the marmalade thin.'.repeat(1 + Math.floor(r() * 3)));
    if (r() < 0.3) words.push('A quince on the pit table.');
    const params = i === 0 ? [...PARAMS] : PARAMS.filter(() => r() < 0.15);
    return {
      type: pick(['guide', 'guide', 'setup'] as const),
      slug: `item-${i}`,
      title: r() < 0.1 ? 'Marmalade run' : `Run ${i}`,
      url: `/guides/item-${i}`,
      aliases: [],
      summary: '',
      body: words.join(' '),
      tags: [],
      class: pick(CLASS_SLUGS),
      surface: pick(SURFACE_SLUGS),
      parameters: params,
    };
  });
}

const hasWord = (d: SearchDocument, w: string) => `${d.title} ${d.body}`.toLowerCase().includes(w);

/** What the facets and total must be: each facet counted with the other facets' filters applied, not its own. */
function expected(items: SearchDocument[], words: string[], f: SearchFilters) {
  const matching = items.filter((d) => words.some((w) => hasWord(d, w)));
  const ok = {
    type: (d: SearchDocument) => !f.type || d.type === f.type,
    class: (d: SearchDocument) => !f.class || d.class === f.class,
    surface: (d: SearchDocument) => !f.surface || d.surface === f.surface,
    parameter: (d: SearchDocument) => !f.parameter || d.parameters.includes(f.parameter),
  };
  const others = (skip: keyof typeof ok) => (d: SearchDocument) => (Object.keys(ok) as Array<keyof typeof ok>).every((k) => k === skip || ok[k](d));
  const tally = (docs: SearchDocument[], values: (d: SearchDocument) => Array<string | null>) => {
    const m = new Map<string, number>();
    for (const d of docs) for (const v of values(d)) if (v) m.set(v, (m.get(v) ?? 0) + 1);
    return [...m].map(([value, count]) => ({ value, count })).sort((a, b) => b.count - a.count || a.value.localeCompare(b.value));
  };
  return {
    total: matching.filter(others('type')).filter(ok.type).length,
    facets: {
      type: tally(matching.filter(others('type')), (d) => [d.type]),
      class: tally(matching.filter(others('class')), (d) => [d.class]),
      surface: tally(matching.filter(others('surface')), (d) => [d.surface]),
      parameter: tally(matching.filter(others('parameter')), (d) => [...new Set(d.parameters)]),
    },
  };
}

function actual(idx: SearchIndex, q: string, f: SearchFilters, limit = 10) {
  const r = idx.search(q, f, limit);
  const strip = (xs: Array<{ value: string; count: number }>) => xs.map(({ value, count }) => ({ value, count }));
  return {
    total: r.total,
    hits: r.hits.length,
    facets: { type: strip(r.facets.type), class: strip(r.facets.class), surface: strip(r.facets.surface), parameter: strip(r.facets.parameter) },
  };
}

const FILTERS: SearchFilters[] = [
  {},
  { type: 'guide' },
  { type: 'setup' },
  { class: CLASSES[0].slug },
  { surface: SURFACES[1].slug },
  { parameter: PARAMS[3] },
  { parameter: PARAMS[40] }, // a parameter in the second word of the bit set
  { type: 'guide', surface: SURFACES[0].slug, parameter: PARAMS[33] },
  { class: CLASSES[2].slug, surface: SURFACES[2].slug },
];

describe('search facets and totals', () => {
  it('count every matching item, each facet with the other filters applied, for one word and for two', () => {
    const items = corpus(400, 11);
    const idx = new SearchIndex();
    idx.load(items);
    for (const [q, words] of [
      ['marmalade', ['marmalade']],
      ['quince', ['quince']],
      ['marmalade quince', ['marmalade', 'quince']],
    ] as const) {
      for (const f of FILTERS) {
        const want = expected(items, [...words], f);
        const got = actual(idx, q, f);
        expect(want.total, `${q} ${JSON.stringify(f)} has matches to count`).toBeGreaterThan(0);
        expect(got.total, `${q} ${JSON.stringify(f)}`).toBe(want.total);
        expect(got.hits).toBe(Math.min(10, want.total));
        expect(got.facets, `${q} ${JSON.stringify(f)}`).toEqual(want.facets);
      }
    }
  });

  it('count an item with more than 40 parameters under each of them', () => {
    const items = corpus(60, 5);
    const idx = new SearchIndex();
    idx.load(items);
    const facets = idx.search('notes', {}, 10).facets.parameter;
    expect(facets.map((p) => p.value).sort()).toEqual([...PARAMS].sort());
    const last = PARAMS[PARAMS.length - 1];
    expect(idx.search('notes', { parameter: last }, 50).hits.map((h) => h.slug)).toContain('item-0');
  });

  it('stay right after items are replaced, removed and added (removed items are not counted)', () => {
    let items = corpus(300, 23);
    const idx = new SearchIndex();
    idx.load(items);
    const r = rng(99);
    for (let round = 0; round < 200; round++) {
      const i = Math.floor(r() * items.length);
      const old = items[i];
      if (round % 5 === 4) {
        idx.remove(old.type, old.slug);
        items = items.filter((d) => d !== old);
        continue;
      }
      // New class, surface, parameters and words for the same item, and now and then a new parameter slug.
      const fresh = corpus(1, 1000 + round)[0];
      const extra = round % 7 === 0 ? [`late-setting-${round}`] : [];
      const next = { ...fresh, type: old.type, slug: old.slug, url: old.url, parameters: [...fresh.parameters.slice(0, 6), ...extra] };
      idx.put(next);
      items = items.map((d) => (d === old ? next : d));
    }
    expect(idx.size).toBe(items.length);
    for (const f of FILTERS) {
      for (const [q, words] of [
        ['marmalade', ['marmalade']],
        ['marmalade quince', ['marmalade', 'quince']],
      ] as const) {
        const want = expected(items, [...words], f);
        const got = actual(idx, q, f, 50);
        expect(got.total, `${q} ${JSON.stringify(f)}`).toBe(want.total);
        expect(got.facets, `${q} ${JSON.stringify(f)}`).toEqual(want.facets);
      }
    }
  });

  it('a parameter filter nothing lists matches nothing (and still counts the other facets)', () => {
    const items = corpus(100, 3);
    const idx = new SearchIndex();
    idx.load(items);
    const r = idx.search('marmalade', { parameter: 'no-such-setting' }, 10);
    expect(r.total).toBe(0);
    expect(r.hits).toEqual([]);
    expect(r.facets.type).toEqual([]);
    // The parameter facet ignores its own filter, so the reader can pick a parameter that exists.
    expect(r.facets.parameter.map((p) => ({ value: p.value, count: p.count }))).toEqual(expected(items, ['marmalade'], {}).facets.parameter);
  });
});
