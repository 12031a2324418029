import { diffLines, diffSentences, diffWordsWithSpace, type ChangeObject } from 'diff';
import type { BodyDiffDetail, DiffPart } from '../../../shared/schemas/revision';

/**
 * Bounds of the body diff. Myers' algorithm costs about (n + m) × d for d edits, so two long bodies that
 * differ everywhere would hold the server for seconds. The bodies are first compared line by line (few
 * tokens, cheap even when they differ throughout); then each changed passage is refined to words, or
 * failing that to sentences, within an edit budget, yielding to other requests between passages and
 * stopping refinement once the time budget is spent. Whatever could not be refined stays a line change,
 * and the answer says so (`detail`).
 */
export const BODY_DIFF_LIMITS = {
  /** Line edits (and time) beyond which the two bodies are shown as one removal and one addition. */
  maxLineEdits: 4000,
  lineTimeoutMs: 150,
  /** Word edits (tokens include spaces) and time allowed within one changed passage. */
  maxWordEdits: 1500,
  wordTimeoutMs: 40,
  /** Sentence edits and time allowed within a passage that was too different word by word. */
  maxSentenceEdits: 400,
  sentenceTimeoutMs: 40,
  /** Time after which the remaining passages stay as lines. */
  refineBudgetMs: 400,
};

export type BodyDiff = { parts: DiffPart[]; detail: BodyDiffDetail };

const part = (c: ChangeObject<string>): DiffPart => ({ value: c.value, ...(c.added ? { added: true } : {}), ...(c.removed ? { removed: true } : {}) });
const yieldToOthers = () => new Promise<void>((resolve) => setImmediate(resolve));

/** A changed passage compared as finely as its budget allows, or null when even sentences were too different. */
function refine(removed: string, added: string): { parts: DiffPart[]; detail: 'words' | 'sentences' } | null {
  const words = diffWordsWithSpace(removed, added, { maxEditLength: BODY_DIFF_LIMITS.maxWordEdits, timeout: BODY_DIFF_LIMITS.wordTimeoutMs });
  if (words) return { parts: words.map(part), detail: 'words' };
  const sentences = diffSentences(removed, added, { maxEditLength: BODY_DIFF_LIMITS.maxSentenceEdits, timeout: BODY_DIFF_LIMITS.sentenceTimeoutMs });
  return sentences ? { parts: sentences.map(part), detail: 'sentences' } : null;
}

/** The diff, one changed passage per step, so a caller can let other work run between steps. */
function* bodyDiffSteps(from: string, to: string): Generator<void, BodyDiff> {
  if (from === to) return { parts: from ? [{ value: from }] : [], detail: 'words' };
  const lines = diffLines(from, to, { maxEditLength: BODY_DIFF_LIMITS.maxLineEdits, timeout: BODY_DIFF_LIMITS.lineTimeoutMs });
  if (!lines) {
    return { parts: [...(from ? [{ value: from, removed: true }] : []), ...(to ? [{ value: to, added: true }] : [])], detail: 'whole' };
  }
  const started = Date.now();
  const parts: DiffPart[] = [];
  const seen = new Set<'words' | 'sentences' | 'lines'>();
  for (let i = 0; i < lines.length; i++) {
    const c = lines[i];
    if (!c.added && !c.removed) {
      parts.push(part(c));
      continue;
    }
    // A changed passage: what was removed here and what was added in its place (either may be empty).
    let removed = '';
    let added = '';
    for (; i < lines.length && (lines[i].added || lines[i].removed); i++) {
      if (lines[i].removed) removed += lines[i].value;
      else added += lines[i].value;
    }
    i--;
    const refined = removed && added && Date.now() - started < BODY_DIFF_LIMITS.refineBudgetMs ? refine(removed, added) : null;
    if (refined) {
      parts.push(...refined.parts);
      seen.add(refined.detail);
    } else {
      if (removed) parts.push({ value: removed, removed: true });
      if (added) parts.push({ value: added, added: true });
      // A passage only added or only removed is exact at any granularity.
      if (removed && added) seen.add('lines');
    }
    yield;
  }
  const detail: BodyDiffDetail = seen.has('lines') ? 'lines' : seen.has('sentences') ? 'sentences' : 'words';
  return { parts: mergeAdjacent(parts), detail };
}

/**
 * The diff of two bodies for reading: words where that can be had within the limits above, else
 * sentences, else whole lines. Other requests get a turn between changed passages.
 */
export async function boundedBodyDiff(from: string, to: string): Promise<BodyDiff> {
  const steps = bodyDiffSteps(from, to);
  for (let r = steps.next(); ; r = steps.next()) {
    if (r.done) return r.value;
    await yieldToOthers();
  }
}

/** The same diff in one go, for short texts already bounded by their caller (a merge conflict's hunk). */
export function boundedBodyDiffSync(from: string, to: string): BodyDiff {
  const steps = bodyDiffSteps(from, to);
  for (let r = steps.next(); ; r = steps.next()) if (r.done) return r.value;
}

/** Joins neighbouring pieces of the same kind, so a reader's view has no seams between passages. */
function mergeAdjacent(parts: DiffPart[]): DiffPart[] {
  const out: DiffPart[] = [];
  for (const p of parts) {
    const last = out.at(-1);
    if (last && !!last.added === !!p.added && !!last.removed === !!p.removed) last.value += p.value;
    else out.push({ ...p });
  }
  return out;
}
