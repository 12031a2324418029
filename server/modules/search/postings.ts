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

/**
 * One term's postings flattened for scoring: item ids, their field-weighted BM25 impact, and whether a
 * headline field holds it; the first `length` entries are used (the arrays have room to append to).
 */
export type FlatPostings = { total: number; length: number; docs: Int32Array; impact: Float32Array; headline: Uint8Array };
/** The fields a query looks in: all of them, or the headline ones (suggestions). */
export type Scope = 'all' | 'headline';
const SCOPES: Scope[] = ['all', 'headline'];
/**
 * A cached flat list also keeps what its impacts were computed with (per field of its scope: boost
 * × idf, NaN while no item held the term there, and the average field length), so items added
 * later are appended on the same footing instead of the whole list being rebuilt.
 */
type CachedPostings = FlatPostings & { fields: Field[]; weights: Float64Array; avgs: Float64Array; pending: number[] };
const MAX_CACHED_TERMS = 4000;
const MAX_PENDING = 1000;

const idfOf = (N: number, n: number) => Math.max(0.01, Math.log(1 + (N - n + 0.5) / (n + 0.5)));

/**
 * Flattened postings per term and field scope, cached. Adding an item queues its short id on the
 * cached lists of its terms; the next read of such a list appends the item's impacts and drops
 * the entries of removed items (in place in typed arrays, not a rebuild from MiniSearch's maps: a
 * search right after an update costs what any other does). Removed items are skipped while scoring
 * until then; idf and lengths are refreshed by a full rebuild once the item count has drifted by 1 %.
 */
export class PostingsCache {
  private flat = new Map<string, CachedPostings>();
  /** Field lengths per field, indexed by short id. */
  private lengths: Float64Array[] = FIELDS.map(() => new Float64Array(1024));

  clear() {
    this.flat.clear();
  }

  grow(size: number) {
    this.lengths = this.lengths.map((a) => {
      const b = new Float64Array(size);
      b.set(a);
      return b;
    });
  }

  /** Notes a newly added item: its field lengths, and its short id on the cached lists of its terms. */
  attach(mini: TermIndex<SearchDocument>, short: number, doc: SearchDocument, queue: boolean) {
    const lens = mini.fieldLengths(short) ?? [];
    FIELDS.forEach((f, i) => (this.lengths[i][short] = lens[mini.fieldId(f)] ?? 0));
    if (!queue || this.flat.size === 0) return;
    const seen = new Set<string>();
    for (const f of FIELDS)
      for (const t of toTerms(fieldText(doc, f))) {
        if (seen.has(t)) continue;
        seen.add(t);
        for (const scope of SCOPES) {
          const key = `${scope}\u0000${t}`;
          const cached = this.flat.get(key);
          if (!cached) continue;
          // A list nobody reads while many items are added is cheaper to rebuild once than to keep queueing for.
          if (cached.pending.length >= MAX_PENDING) this.flat.delete(key);
          else cached.pending.push(short);
        }
      }
  }

  /** `alive[short]` is 0 for discarded items (their postings linger until MiniSearch vacuums them). */
  get(mini: TermIndex<SearchDocument>, alive: Uint8Array, term: string, data: FieldTermData, fields: Field[], scope: Scope): FlatPostings {
    const key = `${scope}\u0000${term}`;
    const cached = this.flat.get(key);
    const N = mini.total;
    if (cached && Math.abs(cached.total - N) <= cached.total * 0.01) {
      if (cached.pending.length) this.patch(cached, mini, alive, data);
      return cached;
    }
    const acc = new Map<number, number>();
    const inHeadline = new Set<number>();
    const weights = new Float64Array(fields.length).fill(NaN);
    const avgs = new Float64Array(fields.length).fill(1);
    for (let f = 0; f < fields.length; f++) {
      const field = fields[f];
      const fid = mini.fieldId(field);
      const postings = data.get(fid);
      if (!postings) continue;
      const n = postings.size;
      // Postings of discarded items linger until vacuumed, so n can pass N: keep idf positive.
      const idf = idfOf(N, n);
      const w = FIELD_BOOST[field] * idf;
      const lens = this.lengths[FIELDS.indexOf(field)];
      const avg = mini.avgFieldLength(fid) || 1;
      weights[f] = w;
      avgs[f] = avg;
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
    const flat: CachedPostings = { total: N, length: acc.size, docs, impact, headline, fields, weights, avgs, pending: [] };
    this.flat.set(key, flat);
    return flat;
  }

  /** Appends the queued items' impacts (computed as the full build would have) and drops removed items. */
  private patch(c: CachedPostings, mini: TermIndex<SearchDocument>, alive: Uint8Array, data: FieldTermData) {
    const added: Array<{ doc: number; v: number; headline: number }> = [];
    for (const doc of new Set(c.pending)) {
      if (alive[doc] === 0) continue;
      let v = 0;
      let headline = 0;
      let holds = false;
      for (let f = 0; f < c.fields.length; f++) {
        const field = c.fields[f];
        const postings = data.get(mini.fieldId(field));
        const tf = postings?.get(doc);
        if (tf === undefined || !postings) continue;
        if (Number.isNaN(c.weights[f])) {
          // The first item holding the term in this field: weigh it as a full build would now.
          c.weights[f] = FIELD_BOOST[field] * idfOf(mini.total, postings.size);
          c.avgs[f] = mini.avgFieldLength(mini.fieldId(field)) || 1;
        }
        const w = c.weights[f];
        const avg = c.avgs[f];
        const len = this.lengths[FIELDS.indexOf(field)][doc];
        v += w * (BM25.d + (tf * (BM25.k + 1)) / (tf + BM25.k * (1 - BM25.b + (BM25.b * len) / avg)));
        holds = true;
        if (HEADLINE_FIELDS.includes(field)) headline = 1;
      }
      if (holds) added.push({ doc, v, headline });
    }
    c.pending = [];
    // Removed items out in place, then the new ones appended; new arrays (with room to spare) only when full.
    const { docs, impact, headline } = c;
    let k = 0;
    for (let i = 0; i < c.length; i++) {
      if (alive[docs[i]] === 0) continue;
      docs[k] = docs[i];
      impact[k] = impact[i];
      headline[k++] = headline[i];
    }
    c.length = k;
    if (k + added.length > docs.length) {
      const room = Math.ceil((k + added.length) * 1.25) + 16;
      const grow = <A extends Int32Array | Float32Array | Uint8Array>(a: A, b: A) => {
        b.set(a.subarray(0, k));
        return b;
      };
      c.docs = grow(docs, new Int32Array(room));
      c.impact = grow(impact, new Float32Array(room));
      c.headline = grow(headline, new Uint8Array(room));
    }
    for (const a of added) {
      c.docs[c.length] = a.doc;
      c.impact[c.length] = a.v;
      c.headline[c.length++] = a.headline;
    }
  }
}
