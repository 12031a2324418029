import { describe, expect, it } from 'vitest';
import { evidenceDiff } from '../../../shared/runlog/evidence-diff';

const run = (id: string) => ({ id, title: `Run ${id}` });

describe('evidenceDiff (proposal vs live evidence, by run id)', () => {
  it('marks kept, added and removed runs, proposal order first, then what was taken off', () => {
    const diff = evidenceDiff([run('b'), run('c')], [run('a'), run('b')]);
    expect(diff.map((d) => [d.run.id, d.change])).toEqual([
      ['b', 'kept'],
      ['c', 'added'],
      ['a', 'removed'],
    ]);
  });

  it('a first version has nothing live: every run is added; an unchanged proposal keeps them all', () => {
    expect(evidenceDiff([run('a')], null).map((d) => d.change)).toEqual(['added']);
    expect(evidenceDiff([run('a'), run('b')], [run('b'), run('a')]).map((d) => d.change)).toEqual(['kept', 'kept']);
    expect(evidenceDiff([], [run('a')]).map((d) => [d.run.id, d.change])).toEqual([['a', 'removed']]);
  });
});
