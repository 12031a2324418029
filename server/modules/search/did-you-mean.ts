import { allowedEdits, editDistance } from './spelling';
import type { SynonymTable } from './synonyms';
import { isNumericTerm, toTerms } from './tokenizer';
import { docId, type SearchDocument } from './types';

/** What "did you mean" chooses from: the parameters' names, the live items, and headline words with their item counts. */
export type Vocabulary = { synonyms: SynonymTable; docs: Map<string, SearchDocument>; headline: Map<string, number> };

/**
 * Nearest known name for a query that matched nothing exactly: a parameter name or alias, or a
 * guide title, within a few edits; else the query with each unknown word replaced by the nearest
 * word from titles, names and tags.
 */
export function didYouMean(q: string, { synonyms, docs, headline }: Vocabulary): string | undefined {
  const terms = toTerms(q);
  if (!terms.length) return undefined;
  const typed = terms.join(' ');
  const squashed = terms.join('');
  let best: { text: string; d: number } | null = null;
  const consider = (candidate: string[], display: string) => {
    const max = Math.max(1, Math.floor(squashed.length / 3));
    const d = Math.min(editDistance(typed, candidate.join(' '), max), editDistance(squashed, candidate.join(''), max));
    if (d <= max && (!best || d < best.d)) best = { text: display, d };
  };
  for (const { slug, terms: name } of synonyms.allNames()) consider(name, docs.get(docId('parameter', slug))?.title ?? name.join(' '));
  for (const d of docs.values()) if (d.type === 'guide') consider(toTerms(d.title), d.title);
  if (best) return (best as { text: string }).text.toLowerCase() === q.trim().toLowerCase() ? undefined : (best as { text: string }).text;
  let changed = false;
  const fixed = terms.map((t) => {
    if (headline.has(t) || isNumericTerm(t)) return t;
    const max = Math.max(1, allowedEdits(t.length));
    let near: { w: string; d: number; n: number } | null = null;
    for (const [w, n] of headline) {
      if (isNumericTerm(w)) continue;
      const d = editDistance(t, w, max);
      if (d <= max && (!near || d < near.d || (d === near.d && n > near.n))) near = { w, d, n };
    }
    if (!near) return t;
    changed = true;
    return near.w;
  });
  return changed ? fixed.join(' ') : undefined;
}
