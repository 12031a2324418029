import { describe, expect, it } from 'vitest';
import { diff3Merge } from 'node-diff3';
import { aroundChanges, handEditStart, resolveBody, resolveFields, type MergeRegion } from '../../src/features/editor/lib/merge';

// Regions built the way the server builds them, from node-diff3 (an independent merge implementation),
// so these checks exercise the helpers on real merge output rather than on hand-made shapes.
function regionsFor(ours: string, base: string, theirs: string): MergeRegion[] {
  const out: MergeRegion[] = [];
  let hunk = 0;
  for (const r of diff3Merge(ours.split('\n'), base.split('\n'), theirs.split('\n'), { excludeFalseConflicts: true })) {
    if (r.ok) out.push({ kind: 'ok', lines: r.ok });
    else if (r.conflict) out.push({ kind: 'conflict', hunk: hunk++, base: r.conflict.o, ours: r.conflict.a, theirs: r.conflict.b });
  }
  return out;
}

const base = ['## Gearing', 'Spur 84, pinion 34.', '## Brake', 'Drag brake 8 %.', '## Heat', 'Check after five minutes.'].join('\n');

describe('resolveBody', () => {
  it('joins non-overlapping changes from both sides without asking anything', () => {
    const theirs = base.replace('pinion 34', 'pinion 32');
    const ours = base.replace('five minutes', 'four minutes');
    const regions = regionsFor(ours, base, theirs);
    const { body, unresolved } = resolveBody(regions, {});
    expect(unresolved).toBe(0);
    expect(body).toContain('pinion 32');
    expect(body).toContain('four minutes');
  });

  it('keeps the draft’s text for an undecided conflict and counts it as unresolved', () => {
    const theirs = base.replace('Drag brake 8 %.', 'Drag brake 10 %.');
    const ours = base.replace('Drag brake 8 %.', 'Drag brake 12 %.');
    const regions = regionsFor(ours, base, theirs);
    expect(regions.filter((r) => r.kind === 'conflict')).toHaveLength(1);
    const undecided = resolveBody(regions, {});
    expect(undecided.unresolved).toBe(1);
    expect(undecided.body).toContain('Drag brake 12 %.');
    expect(undecided.body).not.toContain('Drag brake 10 %.');
  });

  it('applies each kind of choice: theirs, ours and text edited by hand', () => {
    const theirs = base.replace('Drag brake 8 %.', 'Drag brake 10 %.');
    const ours = base.replace('Drag brake 8 %.', 'Drag brake 12 %.');
    const regions = regionsFor(ours, base, theirs);
    expect(resolveBody(regions, { 0: { pick: 'theirs' } }).body).toBe(theirs);
    expect(resolveBody(regions, { 0: { pick: 'ours' } }).body).toBe(ours);
    const custom = resolveBody(regions, { 0: { pick: 'custom', text: 'Drag brake 11 %.\nMore on a dusty day.' } });
    expect(custom.unresolved).toBe(0);
    expect(custom.body).toBe(base.replace('Drag brake 8 %.', 'Drag brake 11 %.\nMore on a dusty day.'));
  });

  it('lets an empty hand edit remove the passage', () => {
    const theirs = base.replace('Drag brake 8 %.', 'Drag brake 10 %.');
    const ours = base.replace('Drag brake 8 %.', 'Drag brake 12 %.');
    const { body } = resolveBody(regionsFor(ours, base, theirs), { 0: { pick: 'custom', text: '' } });
    expect(body.split('\n')).toEqual(['## Gearing', 'Spur 84, pinion 34.', '## Brake', '## Heat', 'Check after five minutes.']);
  });
});

describe('handEditStart', () => {
  it('starts from the live lines followed by the draft’s', () => {
    expect(handEditStart({ kind: 'conflict', hunk: 0, base: ['a'], ours: ['ours 1', 'ours 2'], theirs: ['theirs'] })).toBe('theirs\nours 1\nours 2');
  });
});

describe('resolveFields', () => {
  const merged = { title: 'Mine', class: 'buggy-2wd-stock', tags: ['stock'], body: 'x' };
  const conflicts = [
    { field: 'title', base: 'Old', ours: 'Mine', theirs: 'Theirs' },
    { field: 'tags', base: [], ours: ['stock'], theirs: ['2S'] },
    { field: 'body', hunk: 0, base: 'a', ours: 'b', theirs: 'c' },
  ];

  it('keeps the draft’s values until a side is chosen, ignoring body hunks', () => {
    const r = resolveFields(merged, conflicts, {});
    expect(r.unresolved).toBe(2);
    expect(r.content).toEqual(merged);
  });

  it('takes the chosen side per field', () => {
    const r = resolveFields(merged, conflicts, { title: 'theirs', tags: 'ours' });
    expect(r.unresolved).toBe(0);
    expect(r.content.title).toBe('Theirs');
    expect(r.content.tags).toEqual(['stock']);
    expect(merged.title).toBe('Mine'); // the input is not mutated
  });
});

describe('aroundChanges', () => {
  it('keeps the lines a change sits in and folds the unchanged paragraphs between into one marker', () => {
    const parts = [
      { value: 'Intro.\n\nMore intro.\n\nSpur 84, pinion ' },
      { value: '34', removed: true },
      { value: '32', added: true },
      { value: '.\n\nMiddle one.\n\nMiddle two.\n\nCheck after ' },
      { value: 'five', removed: true },
      { value: 'four', added: true },
      { value: ' minutes.\n\nEnd one.\n\nEnd two.' },
    ];
    expect(aroundChanges(parts)).toEqual([
      { value: '⋯\nSpur 84, pinion ' },
      { value: '34', removed: true },
      { value: '32', added: true },
      { value: '.\n⋯\nCheck after ' },
      { value: 'five', removed: true },
      { value: 'four', added: true },
      { value: ' minutes.\n⋯' },
    ]);
  });

  it('leaves short stretches and a text without changes alone', () => {
    expect(aroundChanges([{ value: 'a ' }, { value: 'b', added: true }, { value: ' c\nd' }])).toEqual([
      { value: 'a ' },
      { value: 'b', added: true },
      { value: ' c\nd' },
    ]);
    expect(aroundChanges([{ value: 'one\ntwo\nthree' }])).toEqual([{ value: 'one\ntwo\nthree' }]);
  });
});
