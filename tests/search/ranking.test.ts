import { describe, expect, it } from 'vitest';
import { SearchIndex, type SearchDocument } from '../../server/modules/search/search-index';

function doc(d: Partial<SearchDocument> & Pick<SearchDocument, 'type' | 'slug' | 'title'>): SearchDocument {
  return {
    url: `/${d.type}s/${d.slug}`,
    aliases: [],
    summary: '',
    body: '',
    tags: [],
    class: null,
    surface: null,
    parameters: d.type === 'parameter' ? [d.slug] : [],
    ...d,
  };
}

const ids = (idx: SearchIndex, q: string, filters = {}) => idx.search(q, filters, 20).hits.map((h) => `${h.type}:${h.slug}`);

describe('search ranking', () => {
  it('ranks an exact match above typo-tolerant ones, even where the fuzzy one sits in a stronger field', () => {
    const idx = new SearchIndex();
    idx.load([
      doc({ type: 'guide', slug: 'fuzzy-title', title: 'Brace yourself for the brave brakes', body: 'Nothing else here.' }),
      doc({ type: 'guide', slug: 'exact-body', title: 'Gearing notes', body: 'Check the brake before the main.' }),
    ]);
    // "brace" and "brave" are one edit from "brake"; only exact-body holds the word itself.
    idx.remove('guide', 'fuzzy-title');
    idx.put(doc({ type: 'guide', slug: 'fuzzy-title', title: 'Brace yourself, brave racer', body: 'Nothing else here.' }));
    const r = idx.search('brake');
    expect(r.hits.map((h) => h.slug)).toEqual(['exact-body', 'fuzzy-title']);
    expect(r.hits.map((h) => h.exact)).toEqual([true, false]);
  });

  it('ranks an exact match above prefix ones', () => {
    const idx = new SearchIndex();
    idx.load([
      doc({ type: 'guide', slug: 'prefix-title', title: 'Punchier starts everywhere', body: '' }),
      doc({ type: 'guide', slug: 'exact-body', title: 'Notes', body: 'Lower the punch on dusty clay.' }),
    ]);
    expect(ids(idx, 'punch')).toEqual(['guide:exact-body', 'guide:prefix-title']);
  });

  it('never fuzzes a token with digits: 17.5T does not find 13.5T', () => {
    const idx = new SearchIndex();
    idx.load([doc({ type: 'guide', slug: 'a', title: '13.5T truck' }), doc({ type: 'guide', slug: 'b', title: '17.5T buggy' })]);
    expect(ids(idx, '17.5T')).toEqual(['guide:b']);
    expect(ids(idx, '17.5t')).toEqual(['guide:b']);
  });

  const library = () => {
    const idx = new SearchIndex();
    idx.load([
      doc({ type: 'parameter', slug: 'drag-brake', title: 'Drag brake', aliases: ['neutral brake', 'drag break', 'dragbreak'], body: 'Braking at neutral.' }),
      doc({ type: 'parameter', slug: 'ramped-advance', title: 'Ramped advance', aliases: ['boost', 'boost timing'], body: 'Timing added with rpm.' }),
      doc({ type: 'parameter', slug: 'low-voltage-cutoff', title: 'Low-voltage cutoff', aliases: ['LVC', 'cutoff'], body: 'Protects the pack.' }),
      doc({
        type: 'guide',
        slug: 'uses-boost',
        title: 'Mod buggy on clay',
        body: 'Run a little boost from 15,000 rpm.',
        class: 'buggy-2wd-mod',
        surface: 'clay',
        parameters: ['ramped-advance'],
      }),
      doc({
        type: 'guide',
        slug: 'uses-ramp',
        title: 'Touring car on asphalt',
        body: 'The ramped advance starts late here.',
        class: 'touring-mod',
        surface: 'asphalt',
        parameters: ['ramped-advance'],
      }),
      doc({
        type: 'guide',
        slug: 'stock-carpet',
        title: 'Stock touring on carpet',
        body: 'No drag brake at all.',
        class: 'touring-stock',
        surface: 'carpet',
        parameters: ['drag-brake'],
      }),
    ]);
    return idx;
  };

  it('uses the library aliases as synonyms in both directions', () => {
    const idx = library();
    expect(ids(idx, 'boost')).toEqual(expect.arrayContaining(['parameter:ramped-advance', 'guide:uses-boost', 'guide:uses-ramp']));
    expect(ids(idx, 'boost')[0]).toBe('parameter:ramped-advance');
    expect(ids(idx, 'ramped advance')).toEqual(expect.arrayContaining(['guide:uses-boost', 'guide:uses-ramp']));
    expect(ids(idx, 'LVC')[0]).toBe('parameter:low-voltage-cutoff');
    expect(ids(idx, 'low voltage cutoff')[0]).toBe('parameter:low-voltage-cutoff');
  });

  it('finds drag brake however it is misspelled or run together', () => {
    const idx = library();
    for (const q of ['dragbreak', 'drag break', 'drag-break', 'dragbrake', 'drag-brake', 'drag brakes', 'drag braek'])
      expect(ids(idx, q)[0], q).toBe('parameter:drag-brake');
  });

  it('counts facets with the other filters applied, and filters hits', () => {
    const idx = library();
    const all = idx.search('boost');
    expect(all.facets.type).toEqual([
      { value: 'guide', label: 'Guide', count: 2 },
      { value: 'parameter', label: 'Parameter', count: 1 },
    ]);
    const clay = idx.search('boost', { surface: 'clay' });
    expect(clay.hits.map((h) => h.slug)).toEqual(['uses-boost']);
    expect(clay.total).toBe(1);
    // The surface facet still shows the other surfaces to switch to.
    expect(clay.facets.surface.map((f) => [f.value, f.count])).toEqual([
      ['asphalt', 1],
      ['clay', 1],
    ]);
    expect(clay.facets.type).toEqual([{ value: 'guide', label: 'Guide', count: 1 }]);
    expect(idx.search('boost', { parameter: 'ramped-advance', type: 'guide' }).total).toBe(2);
  });

  it('highlights the matched words in the snippet', () => {
    const idx = library();
    const hit = idx.search('little boost').hits.find((h) => h.slug === 'uses-boost')!;
    expect(hit.snippet).toBe('Run a <mark>little</mark> <mark>boost</mark> from 15,000 rpm.');
  });

  it('offers "did you mean" when nothing matches as typed', () => {
    const idx = library();
    const r = idx.search('drgabrkae');
    expect(r.total).toBe(0);
    expect(r.didYouMean).toBe('Drag brake');
    expect(idx.search('drag brake').didYouMean).toBeUndefined();
    expect(idx.search('qqqqzzzz').didYouMean).toBeUndefined();
  });

  it('suggests pages by the beginning of the last word', () => {
    const idx = library();
    expect(idx.suggest('drag b')[0]).toMatchObject({ type: 'parameter', slug: 'drag-brake', title: 'Drag brake', url: '/parameters/drag-brake' });
    expect(idx.suggest('ramp').map((s) => s.slug)).toContain('ramped-advance');
  });

  it('replaces and removes single items without a rebuild', () => {
    const idx = library();
    idx.put(doc({ type: 'guide', slug: 'uses-boost', title: 'Mod buggy on clay', body: 'Now with a softer throttle curve.' }));
    expect(ids(idx, 'softer')).toEqual(['guide:uses-boost']);
    expect(ids(idx, 'little')).toEqual([]);
    idx.remove('guide', 'uses-boost');
    expect(ids(idx, 'softer')).toEqual([]);
    expect(idx.size).toBe(5);
  });
});
