import { allowedEdits } from './spelling';
import type { QueryGroup } from './synonyms';
import { isNumericTerm } from './tokenizer';
import type { FieldTermData, FlatPostings, TermIndex } from './postings';
import type { SearchDocument } from './types';

/** Other names of what was typed count, but less than the words typed. */
const EXPANSION_WEIGHT = 0.4;
/** Typo and prefix matches count for less than the word itself (MiniSearch's own weighting curve). */
const WEIGHTS = { fuzzy: 0.35, prefix: 0.5 };
/**
 * A word found as typed in more than this many items is taken as meant: it gets no typo or prefix
 * expansion (which would only add noise and cost). Rarer or unknown words get both.
 */
const KNOWN_WORD_DOCS = 5;
const MAX_PREFIX_TERMS = 40;
/** Query terms are tracked as bits of one 32-bit mask (bits 0-29)… */
const MAX_QUERY_TERMS = 30;
/** …and bit 30 marks an item where a typed word (or its typo/prefix variant) matched, not only another name of it. */
export const TYPED_BIT = 1 << 30;
/** Up to this many places the page is kept in a sorted buffer; past it, sorting all candidates is cheaper. */
const SMALL_PAGE = 200;

/** One index term a query looks up: a typed word, its typo or prefix variant, or another name. */
export type Derived = { term: string; data: FieldTermData; weight: number; bit: number; exact: boolean; typed: boolean };

/** A query's terms to look up, and its groups' forms as term masks (`formGroup`: the group of each form; `bits`: each term's bit). */
export type DerivedQuery = { derived: Derived[]; forms: Int32Array; formGroup: Int32Array; groupCount: number; bits: Map<string, number> };

/** The terms to look up for a query: each typed term (with its typo and prefix variants) and each other name. */
export function deriveTerms(mini: TermIndex<SearchDocument>, groups: QueryGroup[], opts: { lastPrefix?: boolean }): DerivedQuery {
  const bits = new Map<string, number>();
  const typed = groups.flatMap((g) => g.terms);
  const bitOf = (t: string) => {
    let b = bits.get(t);
    if (b === undefined && bits.size < MAX_QUERY_TERMS) bits.set(t, (b = bits.size));
    return b;
  };
  typed.forEach(bitOf);
  for (const g of groups) for (const e of g.expansions) e.forEach(bitOf);
  const derived: Derived[] = [];
  const typedSet = new Set(typed);
  for (const [term, bit] of bits) {
    const isTyped = typedSet.has(term);
    const weight = isTyped ? 1 : EXPANSION_WEIGHT;
    const data = mini.termData(term);
    if (data) derived.push({ term, data, weight, bit, exact: true, typed: isTyped });
    if (!isTyped) continue;
    const rare = mini.docFrequency(term) <= KNOWN_WORD_DOCS;
    const last = typed[typed.length - 1] === term;
    const numeric = isNumericTerm(term);
    const prefix = (!!opts.lastPrefix && last) || (rare && (numeric ? /\d$/.test(term) && term.length >= 2 : term.length >= 3));
    const seen = new Set([term]);
    if (prefix) {
      const found = mini
        .prefixTerms(term)
        .filter(([t]) => t !== term)
        .sort((a, b) => a[0].length - b[0].length)
        .slice(0, MAX_PREFIX_TERMS);
      for (const [t, d] of found) {
        seen.add(t);
        const distance = t.length - term.length;
        derived.push({ term: t, data: d, weight: (WEIGHTS.prefix * t.length) / (t.length + 0.3 * distance), bit, exact: false, typed: true });
      }
    }
    const edits = rare && !numeric ? allowedEdits(term.length) : 0;
    if (edits) {
      for (const [t, d, distance] of mini.fuzzyTerms(term, edits)) {
        if (seen.has(t) || isNumericTerm(t)) continue;
        derived.push({ term: t, data: d, weight: (WEIGHTS.fuzzy * t.length) / (t.length + distance), bit, exact: false, typed: true });
      }
    }
  }
  const formMask = (terms: string[]) => {
    let m = 0;
    for (const t of terms) {
      const b = bits.get(t);
      if (b === undefined) return 0;
      m |= 1 << b;
    }
    return m;
  };
  // Flat lists for the hot loop: form masks, and which group each form belongs to.
  const forms: number[] = [];
  const formGroup: number[] = [];
  groups.forEach((g, gi) => {
    for (const f of [g.terms, ...g.expansions]) {
      const m = formMask(f);
      if (m) {
        forms.push(m);
        formGroup.push(gi);
      }
    }
  });
  return { derived, forms: Int32Array.from(forms), formGroup: Int32Array.from(formGroup), groupCount: groups.length, bits };
}

/**
 * The terms a hit holds, for its snippet: the words typed (or their typo/prefix variants), else
 * the other names. Scoring already noted each exact term's bit in `m` (over every field); only
 * typo and prefix variants need a look-up.
 */
export function termsIn(derived: Derived[], doc: number, m: number) {
  const typedTerms = new Set<string>();
  const otherTerms = new Set<string>();
  for (const d of derived) {
    const holds = d.exact ? ((m >>> d.bit) & 1) === 1 : [...d.data.values()].some((postings) => postings.has(doc));
    if (holds) (d.typed ? typedTerms : otherTerms).add(d.term);
  }
  return typedTerms.size ? typedTerms : otherTerms;
}

/**
 * Per-item scores in flat arrays indexed by short id, reused by every query (so a query allocates
 * nothing per item), with the matched terms as bits of one mask (bit 30: a typed word matched).
 */
export class ScoreBoard {
  score = new Float64Array(1024);
  mask = new Int32Array(1024);
  hmask = new Int32Array(1024);
  // Reused per query: the items touched by scoring, and the ones that pass the filters with their tier.
  touchedIds = new Int32Array(1024);
  candidateIds = new Int32Array(1024);
  candidateTiers = new Int32Array(1024);
  private coverageKeys = new Int32Array(256);
  private coverageValues = new Int32Array(256);

  grow(size: number) {
    const grow = <A extends Float64Array | Int32Array>(a: A, make: (n: number) => A) => {
      const b = make(size);
      b.set(a);
      return b;
    };
    this.score = grow(this.score, (k) => new Float64Array(k));
    this.mask = grow(this.mask, (k) => new Int32Array(k));
    this.hmask = grow(this.hmask, (k) => new Int32Array(k));
    this.touchedIds = new Int32Array(size);
    this.candidateIds = new Int32Array(size);
    this.candidateTiers = new Int32Array(size);
  }

  /**
   * Scores every matching item into the flat arrays. The touched short ids go to `touchedIds`;
   * returns how many there are.
   */
  scoreAll(derived: Derived[], flatten: (term: string, data: FieldTermData) => FlatPostings): number {
    const { score, mask, hmask, touchedIds } = this;
    let n = 0;
    for (const d of derived) {
      const p = flatten(d.term, d.data);
      const bit = d.exact ? 1 << d.bit : 0;
      const typedBit = d.typed ? TYPED_BIT : 0;
      const w = d.weight;
      const { docs, impact, headline, length } = p;
      // Items removed since these postings were flattened are scored too and dropped once, in collect().
      for (let i = 0; i < length; i++) {
        const doc = docs[i];
        // Every impact and weight is positive, so a zero score means "not touched yet".
        if (score[doc] === 0) touchedIds[n++] = doc;
        score[doc] += w * impact[i];
        mask[doc] |= bit | typedBit;
        if (headline[i]) hmask[doc] |= bit;
      }
    }
    return n;
  }

  /**
   * How many query groups a term mask covers (some form of the group has all its terms in the mask),
   * as a function remembered per mask: the items of one query share a handful of masks. A small
   * direct-mapped table, since a Map lookup per item costs more than the counting it saves.
   */
  coverage(forms: Int32Array, formGroup: Int32Array) {
    const keys = this.coverageKeys.fill(-1);
    const values = this.coverageValues;
    const slotMask = keys.length - 1;
    return (m: number) => {
      if (m === 0) return 0;
      const h = (Math.imul(m, 0x9e3779b1) >>> 24) & slotMask;
      if (keys[h] === m) return values[h];
      let n = 0;
      for (let k = 0; k < forms.length;) {
        const g = formGroup[k];
        if ((m & forms[k]) === forms[k]) {
          n++;
          while (k < forms.length && formGroup[k] === g) k++; // on to the next group
        } else k++;
      }
      keys[h] = m;
      values[h] = n;
      return n;
    };
  }

  /**
   * The best `limit` candidates by (tier, score), kept in a small sorted buffer: only the page is
   * ordered. Equal candidates keep their collection order, so any page of a query is a slice of one
   * ranking (no item on two pages, none skipped); deep pages sort every candidate instead.
   */
  selectPage(candidates: number, limit: number) {
    if (limit > SMALL_PAGE) return this.sortAll(candidates).slice(0, limit);
    const { score, candidateIds, candidateTiers } = this;
    const page: Array<{ doc: number; tier: number }> = [];
    // The page's worst entry, kept in locals so most candidates are turned away with two comparisons.
    let worstTier = -1;
    let worstScore = -1;
    for (let i = 0; i < candidates; i++) {
      const doc = candidateIds[i];
      const tier = candidateTiers[i];
      const s = score[doc];
      if (page.length >= limit && (tier < worstTier || (tier === worstTier && s <= worstScore))) continue;
      let at = page.length;
      while (at > 0) {
        const p = page[at - 1];
        if (!(tier > p.tier || (tier === p.tier && s > score[p.doc]))) break;
        at--;
      }
      page.splice(at, 0, { doc, tier });
      if (page.length > limit) page.pop();
      const last = page[page.length - 1];
      worstTier = last.tier;
      worstScore = score[last.doc];
    }
    return page;
  }

  /** Every candidate in ranking order (a stable sort: ties keep collection order, as in selectPage). */
  private sortAll(candidates: number) {
    const { score, candidateIds, candidateTiers } = this;
    const all = Array.from({ length: candidates }, (_, i) => ({ doc: candidateIds[i], tier: candidateTiers[i] }));
    return all.sort((a, b) => b.tier - a.tier || score[b.doc] - score[a.doc]);
  }

  /** Back to all zeros for the next query (`idLimit`: one past the highest short id given out). */
  clear(touchedCount: number, idLimit: number) {
    const { score, mask, hmask, touchedIds } = this;
    if (touchedCount * 4 > idLimit) {
      // Most items were touched: clearing whole ranges is cheaper than one store per item and array.
      score.fill(0, 0, idLimit);
      mask.fill(0, 0, idLimit);
      hmask.fill(0, 0, idLimit);
      return;
    }
    for (let i = 0; i < touchedCount; i++) {
      const doc = touchedIds[i];
      score[doc] = 0;
      mask[doc] = 0;
      hmask[doc] = 0;
    }
  }
}
