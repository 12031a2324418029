import { boundedBodyDiffSync } from './body-diff';
import { diff3Merge } from 'node-diff3';
import { parseWorkedExample } from '../../../shared/calc/worked-example';
import { runCalculator } from '../../../shared/calc/registry';
import type { BodyRegion, ChangedField, DiffPart, MergeConflict, WorkedExampleCheck } from '../../../shared/schemas/revision';

type Content = Record<string, unknown>;

const same = (a: unknown, b: unknown) => JSON.stringify(a ?? null) === JSON.stringify(b ?? null);
/** A content's Markdown body ('' when it has none). */
export const bodyOf = (c: Content) => (typeof c.body === 'string' ? c.body : '');

/** Every field except the body whose value differs, in the order of the newer content's keys. */
export function changedFields(from: Content, to: Content): ChangedField[] {
  const keys = [...new Set([...Object.keys(to), ...Object.keys(from)])].filter((k) => k !== 'body');
  return keys.filter((k) => !same(from[k], to[k])).map((field) => ({ field, from: from[field] ?? null, to: to[field] ?? null }));
}

/** Diff of the two bodies (words where the limits allow, whitespace kept), worked out in one go: for the merge screen's hunks. */
export function bodyDiff(from: Content, to: Content): DiffPart[] {
  return boundedBodyDiffSync(bodyOf(from), bodyOf(to)).parts;
}

/** The text of each ```worked-example (or ~~~worked-example) fenced block, in order. */
export function workedExampleBlocks(body: string): string[] {
  const blocks: string[] = [];
  const lines = body.split(/\r?\n/);
  for (let i = 0; i < lines.length; i++) {
    const open = /^ {0,3}(`{3,}|~{3,})\s*([^\s`]*)/.exec(lines[i]);
    if (!open) continue;
    const fence = open[1];
    const isExample = open[2] === 'worked-example';
    const inner: string[] = [];
    let j = i + 1;
    for (; j < lines.length; j++) {
      const close = /^ {0,3}(`{3,}|~{3,})\s*$/.exec(lines[j]);
      if (close && close[1][0] === fence[0] && close[1].length >= fence.length) break;
      inner.push(lines[j]);
    }
    if (isExample) blocks.push(inner.join('\n'));
    i = j;
  }
  return blocks;
}

/** Runs every worked example of a body through its calculator: input problems as issues, cautions as warnings. */
export function checkWorkedExamples(body: string): WorkedExampleCheck[] {
  return workedExampleBlocks(body).map((text, index) => {
    const parsed = parseWorkedExample(text);
    if (!parsed.ok) return { index, calc: parsed.calc ?? null, ok: false, issues: parsed.issues, warnings: [] };
    const run = runCalculator(parsed.calc, parsed.rawInputs);
    if (!run.ok) return { index, calc: parsed.calc, ok: false, issues: run.issues, warnings: [] };
    return { index, calc: parsed.calc, ok: true, issues: [], warnings: run.output.warnings };
  });
}

export type ThreeWayMerge = {
  merged: Content;
  conflicts: MergeConflict[];
  bodyRegions: BodyRegion[];
  incoming: { changedFields: ChangedField[]; bodyDiff: DiffPart[] };
};

/**
 * Three-way merge of a draft ("ours") and the live revision ("theirs") against the draft's base.
 * Metadata field by field (take the side that changed; both changed differently is a conflict);
 * the body line by line with diff3. Conflicts keep our value in `merged`, so nothing of the
 * proposer's text is lost if they save it as it is. `incoming` is what the merge takes from the live
 * side (draft → merged), so the author can see what changes in their text before saving it.
 */
export function threeWayMerge(base: Content, ours: Content, theirs: Content): ThreeWayMerge {
  const merged: Content = {};
  const conflicts: MergeConflict[] = [];
  const keys = [...new Set([...Object.keys(ours), ...Object.keys(theirs), ...Object.keys(base)])].filter((k) => k !== 'body');
  for (const field of keys) {
    const weChanged = !same(base[field], ours[field]);
    const theyChanged = !same(base[field], theirs[field]);
    if (weChanged && theyChanged && !same(ours[field], theirs[field])) {
      conflicts.push({ field, base: base[field] ?? null, ours: ours[field] ?? null, theirs: theirs[field] ?? null });
      merged[field] = ours[field];
    } else {
      merged[field] = theyChanged ? theirs[field] : ours[field];
    }
  }

  const split = (s: string) => (s === '' ? [] : s.split('\n'));
  const regions = diff3Merge(split(bodyOf(ours)), split(bodyOf(base)), split(bodyOf(theirs)), { excludeFalseConflicts: true });
  const bodyRegions: BodyRegion[] = [];
  const out: string[] = [];
  let hunk = 0;
  for (const region of regions) {
    if (region.ok) {
      out.push(...region.ok);
      const last = bodyRegions.at(-1);
      if (last?.kind === 'ok') last.lines.push(...region.ok);
      else bodyRegions.push({ kind: 'ok', lines: [...region.ok] });
    } else if (region.conflict) {
      const { a, o, b } = region.conflict;
      out.push(...a);
      bodyRegions.push({ kind: 'conflict', hunk, base: [...o], ours: [...a], theirs: [...b], words: bodyDiff({ body: b.join('\n') }, { body: a.join('\n') }) });
      conflicts.push({ field: 'body', hunk, base: o.join('\n'), ours: a.join('\n'), theirs: b.join('\n') });
      hunk++;
    }
  }
  merged.body = out.join('\n');
  return { merged, conflicts, bodyRegions, incoming: { changedFields: changedFields(ours, merged), bodyDiff: bodyDiff(ours, merged) } };
}
