import { describe, expect, it } from 'vitest';
import { changedFields, threeWayMerge, workedExampleBlocks } from '../../../server/modules/revisions/compare';
import { slugify } from '../../../server/modules/revisions/content';

describe('threeWayMerge', () => {
  const base = { title: 'T', tags: ['a'], body: 'one\ntwo\nthree\nfour' };

  it('takes each side’s change where only that side changed', () => {
    const ours = { ...base, tags: ['a', 'b'], body: 'one\nTWO\nthree\nfour' };
    const theirs = { ...base, title: 'T2', body: 'one\ntwo\nthree\nFOUR' };
    const r = threeWayMerge(base, ours, theirs);
    expect(r.conflicts).toEqual([]);
    expect(r.merged).toEqual({ title: 'T2', tags: ['a', 'b'], body: 'one\nTWO\nthree\nFOUR' });
  });

  it('treats the same change on both sides as no conflict', () => {
    const same = { ...base, title: 'Same', body: 'one\nzwei\nthree\nfour' };
    const r = threeWayMerge(base, same, { ...same });
    expect(r.conflicts).toEqual([]);
    expect(r.merged).toEqual(same);
  });

  it('reports both sides changing the same lines, and a whole-body rewrite against an append', () => {
    const r = threeWayMerge(base, { ...base, body: 'one\nours\nthree\nfour' }, { ...base, body: 'one\ntheirs\nthree\nfour' });
    expect(r.conflicts).toEqual([{ field: 'body', hunk: 0, base: 'two', ours: 'ours', theirs: 'theirs' }]);
    expect(r.merged.body).toBe('one\nours\nthree\nfour');
    const empty = threeWayMerge({ body: '' }, { body: 'ours' }, { body: 'theirs' });
    expect(empty.conflicts).toHaveLength(1);
  });

  it('marks inside a conflicting hunk which words differ (live → draft)', () => {
    const long = { body: 'Intro.\nUnder 75 °C after a race is fine; at 80 °C drop a tooth.\nEnd.' };
    const r = threeWayMerge(long, { body: long.body.replace('75', '80') }, { body: long.body.replace('75', '70') });
    const hunk = r.bodyRegions.find((x) => x.kind === 'conflict');
    expect(hunk?.kind === 'conflict' && hunk.words.filter((w) => w.added || w.removed)).toEqual([
      { value: '70', removed: true },
      { value: '80', added: true },
    ]);
  });

  it('says what the merge brings in from the live side: fields it takes and the body words it changes in the draft', () => {
    const ours = { ...base, tags: ['a', 'b'], body: 'one\nTWO\nthree\nfour' };
    const theirs = { ...base, title: 'T2', body: 'one\ntwo\nthree\nFOUR' };
    const { incoming } = threeWayMerge(base, ours, theirs);
    expect(incoming.changedFields).toEqual([{ field: 'title', from: 'T', to: 'T2' }]);
    expect(incoming.bodyDiff.filter((w) => w.added || w.removed)).toEqual([
      { value: 'four', removed: true },
      { value: 'FOUR', added: true },
    ]);
    // A conflict keeps the draft's side in `merged`, so it is not "incoming".
    const conflicted = threeWayMerge(base, { ...base, body: 'one\nours\nthree\nfour' }, { ...base, body: 'one\ntheirs\nthree\nfour' });
    expect(conflicted.incoming.bodyDiff.every((w) => !w.added && !w.removed)).toBe(true);
  });
});

describe('changedFields', () => {
  it('lists metadata that differs (arrays by value), never the body', () => {
    expect(changedFields({ a: 1, tags: ['x'], body: 'b' }, { a: 1, tags: ['x', 'y'], body: 'c', extra: true })).toEqual([
      { field: 'tags', from: ['x'], to: ['x', 'y'] },
      { field: 'extra', from: null, to: true },
    ]);
  });
});

describe('workedExampleBlocks', () => {
  it('finds ``` and ~~~ worked-example fences, skipping other code and fences inside longer fences', () => {
    const body = [
      '```worked-example',
      'calc: motor',
      '```',
      '````md',
      '```worked-example',
      'calc: nope',
      '```',
      '````',
      '~~~ worked-example',
      'calc: pack',
      '~~~',
      '```js',
      'x',
      '```',
    ].join('\n');
    expect(workedExampleBlocks(body)).toEqual(['calc: motor', 'calc: pack']);
  });
});

describe('slugify', () => {
  it('makes kebab-case ASCII slugs from titles', () => {
    expect(slugify('Stock 2WD buggy on Harbour Flats clay, tight layout')).toBe('stock-2wd-buggy-on-harbour-flats-clay-tight-layout');
    expect(slugify('Crème brûlée — 17.5T & “2S” packs')).toBe('creme-brulee-17-5t-2s-packs');
    expect(slugify('!!!')).toBe('');
    expect(slugify('word '.repeat(40)).length).toBeLessThanOrEqual(80);
    expect(slugify('word '.repeat(40))).toMatch(/^word(-word)*$/);
  });
});
