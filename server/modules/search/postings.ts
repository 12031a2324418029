import MiniSearch from 'minisearch';
import { CLASSES, SURFACES } from '../../../shared/constants';
import { toTerms } from './tokenizer';
import { docId, paramWords, type SearchDocument } from './types';

export const FIELDS = ['title', 'aliases', 'summary', 'body', 'tags', 'class', 'surface', 'parameters'] as const;
export type Field = (typeof FIELDS)[number];

/** Field weights: what a page is called counts most, then how it is described, then its text. */
export const FIELD_BOOST: Record<Field, number> = { title: 8, aliases: 7, summary: 2.5, body: 1, tags: 3, class: 2.5, surface: 2.5, parameters: 1.2 };
/** Fields that say what a page is (rather than what it mentions). */
export const HEADLINE_FIELDS: Field[] = ['title', 'aliases', 'tags', 'class', 'surface'];
const BM25 = { k: 1.2, b: 0.7, d: 0.5 };

export const CLASS_NAMES = new Map<string, string>(CLASSES.map((c) => [c.slug, c.name]));
export const SURFACE_NAMES = new Map<string, string>(SURFACES.map((s) => [s.slug, s.name]));

export type FieldTermData = Map<number, Map<number, number>>;

/** The text MiniSearch indexes for one field of an item. */
export function fieldText(doc: SearchDocument, field: Field | 'id'): string {
  switch (field) {
    case 'id':
      return docId(doc.type, doc.slug);
    case 'title':
      return doc.title;
    case 'aliases':
      // Run-together forms ("dragbrake") are not indexed: the synonym table maps them to the words.
      return doc.aliases.join(' ; ');
    case 'summary':
      return doc.summary;
    case 'body':
      return doc.body;
    case 'tags':
      return doc.tags.join(' ; ');
    case 'class':
      return doc.class ? `${paramWords(doc.class)} ; ${CLASS_NAMES.get(doc.class) ?? ''}` : '';
    case 'surface':
      return doc.surface ? `${paramWords(doc.surface)} ; ${SURFACE_NAMES.get(doc.surface) ?? ''}` : '';
    case 'parameters':
      return doc.parameters.map(paramWords).join(' ; ');
  }
}

/**
 * MiniSearch keeps the index (terms in a radix tree, postings, field lengths, discard and vacuum);
 * this subclass reads that table directly to score with flat arrays instead of one object per
 * matching item, which is what keeps a query over 10,000 guides within a couple of milliseconds.
 */
export class TermIndex<T> extends MiniSearch<T> {
  termData(term: string): FieldTermData | undefined {
    return this._index.get(term);
  }
  prefixTerms(prefix: string): Array<[string, FieldTermData]> {
    return [...this._index.atPrefix(prefix)];
  }
  fuzzyTerms(term: string, maxDistance: number): Array<[string, FieldTermData, number]> {
    return [...this._index.fuzzyGet(term, maxDistance)].map(([t, [data, d]]) => [t, data, d]);
  }
  fieldId(field: string) {
    return this._fieldIds[field];
  }
  shortId(id: string) {
    return this._idToShortId.get(id);
  }
  fieldLengths(shortId: number) {
    return this._fieldLength.get(shortId);
  }
  avgFieldLength(fieldId: number) {
    return this._avgFieldLength[fieldId];
  }
  get total() {
    return this._documentCount;
  }
  docFrequency(term: string): number {
    const fields = this._index.get(term);
    if (!fields) return 0;
    let n = 0;
    for (const docs of fields.values()) n = Math.max(n, docs.size);
    return n;
  }
}

/** One term's postings flattened for scoring: item ids, their field-weighted BM25 impact, and whether a headline field holds it. */
export type FlatPostings = { gen: number; total: number; docs: Int32Array; impact: Float32Array; headline: Uint8Array };
const MAX_CACHED_TERMS = 4000;

/**
 * Flattened postings per term and field scope, cached. Per-term change counters: adding an item
 * bumps the counters of its terms, so only their flattened postings are rebuilt. Removed items are
 * skipped while scoring; idf and lengths are refreshed once the item count has drifted by 1 %.
 */
export class PostingsCache {
  private flat = new Map<string, FlatPostings>();
  private termGen = new Map<string, number>();
  /** Field lengths per field, indexed by short id. */
  private lengths: Float64Array[] = FIELDS.map(() => new Float64Array(1024));

  clear() {
    this.flat.clear();
    this.termGen.clear();
  }

  grow(size: number) {
    this.lengths = this.lengths.map((a) => {
      const b = new Float64Array(size);
      b.set(a);
      return b;
    });
  }

  /** Notes a newly added item's field lengths. */
  attach(mini: TermIndex<SearchDocument>, short: number) {
    const lens = mini.fieldLengths(short) ?? [];
    FIELDS.forEach((f, i) => (this.lengths[i][short] = lens[mini.fieldId(f)] ?? 0));
  }

  /** The item about to be added holds these terms: their flattened postings are out of date. */
  touch(doc: SearchDocument) {
    for (const f of FIELDS) for (const t of toTerms(fieldText(doc, f))) this.termGen.set(t, (this.termGen.get(t) ?? 0) + 1);
  }

  /** `alive[short]` is 0 for discarded items (their postings linger until MiniSearch vacuums them). */
  get(mini: TermIndex<SearchDocument>, alive: Uint8Array, term: string, data: FieldTermData, fields: Field[], scope: string): FlatPostings {
    const key = `${scope}\u0000${term}`;
    const cached = this.flat.get(key);
    const gen = this.termGen.get(term) ?? 0;
    const N = mini.total;
    if (cached && cached.gen === gen && Math.abs(cached.total - N) <= cached.total * 0.01) return cached;
    const acc = new Map<number, number>();
    const inHeadline = new Set<number>();
    for (const field of fields) {
      const fid = mini.fieldId(field);
      const postings = data.get(fid);
      if (!postings) continue;
      const n = postings.size;
      // Postings of discarded items linger until vacuumed, so n can pass N: keep idf positive.
      const idf = Math.max(0.01, Math.log(1 + (N - n + 0.5) / (n + 0.5)));
      const w = FIELD_BOOST[field] * idf;
      const lens = this.lengths[FIELDS.indexOf(field)];
      const avg = mini.avgFieldLength(fid) || 1;
      const headline = HEADLINE_FIELDS.includes(field);
      postings.forEach((tf, doc) => {
        if (alive[doc] === 0) return; // discarded, not yet vacuumed
        const v = w * (BM25.d + (tf * (BM25.k + 1)) / (tf + BM25.k * (1 - BM25.b + (BM25.b * lens[doc]) / avg)));
        acc.set(doc, (acc.get(doc) ?? 0) + v);
        if (headline) inHeadline.add(doc);
      });
    }
    const docs = new Int32Array(acc.size);
    const impact = new Float32Array(acc.size);
    const headline = new Uint8Array(acc.size);
    let i = 0;
    for (const [doc, v] of acc) {
      docs[i] = doc;
      impact[i] = v;
      headline[i] = inHeadline.has(doc) ? 1 : 0;
      i++;
    }
    if (this.flat.size >= MAX_CACHED_TERMS) this.flat.clear();
    const flat = { gen, total: N, docs, impact, headline };
    this.flat.set(key, flat);
    return flat;
  }
}
