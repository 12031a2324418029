import { distance as levenshtein } from 'fastest-levenshtein';
import type { TermIndex } from './postings';
import type { Derived, DerivedQuery } from './scoring';
import type { QueryGroup } from './synonyms';
import { processTerm, tokenizeWithSpans, toTerms } from './tokenizer';
import type { SearchDocument } from './types';

/** A run-together or misspelt name this close to a parameter's name (in letters) was meant as that name. */
const NAME_SPELLING_EDITS = 2;

const letters = (s: string) => s.toLowerCase().replace(/[^\p{L}\p{N}]/gu, '');

type Context = {
  mini: TermIndex<SearchDocument>;
  /** A parameter's name by slug. */
  parameterName: (slug: string) => string | undefined;
};

/**
 * What a query's results were found for, when that is not what was typed, or undefined: a group
 * naming a parameter by a run-together or misspelt form ("dragbreak", "drag break") reads as the
 * parameter's name; a word the index does not hold reads as the typo or prefix variant that matched
 * it. The rest of the query stays as typed (the corrected words replace the typed ones in place).
 */
export function searchedFor(q: string, groups: QueryGroup[], query: DerivedQuery, { mini, parameterName }: Context): string | undefined {
  // The query's words with their places in `q`, lined up with the terms the groups were made from.
  const spans = tokenizeWithSpans(q).filter((s) => processTerm(s.token));
  if (spans.length !== groups.reduce((n, g) => n + g.terms.length, 0) || q.length !== q.toLowerCase().length) return undefined;
  const edits: Array<{ start: number; end: number; text: string }> = [];
  let at = 0;
  for (const g of groups) {
    const first = spans[at];
    const last = spans[at + g.terms.length - 1];
    at += g.terms.length;
    const text = correction(g, query, mini, parameterName);
    if (text !== undefined) edits.push({ start: first.start, end: last.end, text });
  }
  if (!edits.length) return undefined;
  let out = '';
  let pos = 0;
  for (const e of edits) {
    out += q.slice(pos, e.start) + e.text;
    pos = e.end;
  }
  return (out + q.slice(pos)).trim();
}

/** The words one group was searched as, when they differ from the typed ones. */
function correction(g: QueryGroup, { derived, bits }: DerivedQuery, mini: TermIndex<SearchDocument>, parameterName: (slug: string) => string | undefined) {
  const unknown = g.terms.filter((t) => !mini.termData(t));
  const name = g.slugs.length ? parameterName(g.slugs[0]) : undefined;
  if (name) {
    const typed = letters(g.terms.join(''));
    const named = letters(name);
    if (g.terms.join(' ') === toTerms(name).join(' ')) return undefined;
    if (unknown.length || (typed !== named && levenshtein(typed, named) <= NAME_SPELLING_EDITS)) return name.toLowerCase();
    return undefined;
  }
  if (g.terms.length !== 1 || !unknown.length) return undefined;
  // The strongest variant of the unknown word that matched something (typo or prefix), most used first on a tie.
  const bit = bits.get(g.terms[0]);
  let best: Derived | undefined;
  for (const d of derived) {
    if (d.exact || !d.typed || d.bit !== bit) continue;
    if (!best || d.weight > best.weight || (d.weight === best.weight && mini.docFrequency(d.term) > mini.docFrequency(best.term))) best = d;
  }
  return best?.term;
}
