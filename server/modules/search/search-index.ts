import MiniSearch from 'minisearch';
import { CLASSES, SURFACES } from '../../../shared/constants';
import { SEARCH_TYPES, type SearchFacets, type SearchHit, type SearchSuggestion, type SearchType } from '../../../shared/schemas/search';
import { allowedEdits, editDistance } from './spelling';
import { SynonymTable, type QueryGroup } from './synonyms';
import { isNumericTerm, processTerm, tokenize, tokenizeWithSpans, toTerms } from './tokenizer';

/** One searchable item: a live parameter entry, a live guide, or a live guide's baseline setup. */
export type SearchDocument = {
  type: SearchType;
  slug: string;
  title: string;
  url: string;
  aliases: string[];
  summary: string;
  /** Plain text (Markdown already stripped). */
  body: string;
  tags: string[];
  class: string | null;
  surface: string | null;
  /** Parameter slugs the item is about (a parameter lists itself). */
  parameters: string[];
};

export type SearchFilters = { type?: SearchType; class?: string; surface?: string; parameter?: string };

export type IndexSearchResult = { hits: SearchHit[]; facets: SearchFacets; total: number; didYouMean?: string };

const FIELDS = ['title', 'aliases', 'summary', 'body', 'tags', 'class', 'surface', 'parameters'] as const;
type Field = (typeof FIELDS)[number];

/** Field weights: what a page is called counts most, then how it is described, then its text. */
export const FIELD_BOOST: Record<Field, number> = { title: 8, aliases: 7, summary: 2.5, body: 1, tags: 3, class: 2.5, surface: 2.5, parameters: 1.2 };
/** Fields that say what a page is (rather than what it mentions). */
const HEADLINE_FIELDS: Field[] = ['title', 'aliases', 'tags', 'class', 'surface'];
const SUGGEST_FIELDS: Field[] = HEADLINE_FIELDS;
/** A query that is a parameter's own name or alias puts that parameter first; one that only contains it, less so. */
const NAMED_PARAMETER_BOOST = { whole: 4, part: 1.5 };
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
/** Query terms are tracked as bits of one 32-bit mask. */
const MAX_QUERY_TERMS = 30;
const BM25 = { k: 1.2, b: 0.7, d: 0.5 };

const CLASS_NAMES = new Map<string, string>(CLASSES.map((c) => [c.slug, c.name]));
const SURFACE_NAMES = new Map<string, string>(SURFACES.map((s) => [s.slug, s.name]));
const TYPE_LABELS: Record<SearchType, string> = { parameter: 'Parameter', guide: 'Guide', setup: 'Setup' };
const CLASS_INDEX = new Map<string, number>(CLASSES.map((c, i) => [c.slug, i]));
const SURFACE_INDEX = new Map<string, number>(SURFACES.map((s, i) => [s.slug, i]));
const TYPE_INDEX = new Map<string, number>(SEARCH_TYPES.map((t, i) => [t, i]));

const docId = (type: SearchType, slug: string) => `${type}:${slug}`;
const paramWords = (slug: string) => slug.replace(/-/g, ' ');

type FieldTermData = Map<number, Map<number, number>>;

const isWordChar = (c: string | undefined) => !!c && /[\p{L}\p{N}]/u.test(c);

/**
 * Where the written forms of index terms occur in `lower` (already lower-cased): "brake" finds
 * brake and brakes, "battery" batteries, "3.2v" both 3.2V and 3.2 V. indexOf scans are far cheaper
 * than a regex over a long body; the window chosen is tokenized properly afterwards.
 */
function findWords(lower: string, terms: Set<string>): Array<{ at: number; term: string }> {
  const out: Array<{ at: number; term: string }> = [];
  for (const t of terms) {
    const num = /^(\d+(?:\.\d+)?)([a-z%°]+)$/.exec(t);
    const needles = num ? [num[1], num[1].replace('.', ',')] : t.endsWith('y') ? [t, `${t.slice(0, -1)}ies`] : [t];
    for (const needle of new Set(needles)) {
      for (let at = lower.indexOf(needle); at !== -1; at = lower.indexOf(needle, at + needle.length)) {
        if (isWordChar(lower[at - 1])) continue;
        let end = at + needle.length;
        if (num) {
          if (lower[end] === ' ' || lower[end] === '-') end++;
          if (!lower.startsWith(num[2], end)) continue;
          end += num[2].length;
        } else if (lower.startsWith('es', end) && !isWordChar(lower[end + 2])) end += 2;
        else if (lower[end] === 's' && !isWordChar(lower[end + 1])) end += 1;
        if (isWordChar(lower[end])) continue;
        out.push({ at, term: t });
      }
    }
  }
  return out.sort((a, b) => a.at - b.at);
}

/**
 * MiniSearch keeps the index (terms in a radix tree, postings, field lengths, discard and vacuum);
 * this subclass reads that table directly to score with flat arrays instead of one object per
 * matching item, which is what keeps a query over 10,000 guides within a couple of milliseconds.
 */
class TermIndex<T> extends MiniSearch<T> {
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

type FacetCounts = { type: Int32Array; class: Int32Array; surface: Int32Array; parameter: Int32Array };

/**
 * Facet counts over the matching items. Each facet is counted with the other facets' filters
 * applied but not its own, so a reader can switch value. `flags` bits: 1 type, 2 class, 4 surface,
 * 8 parameter filter passed.
 */
function countFacets(
  docs: number[],
  flags: number[],
  items: { itemType: Int8Array; itemClass: Int8Array; itemSurface: Int8Array; itemParamCount: Uint8Array; itemParams: Uint16Array },
  counts: FacetCounts,
) {
  const { type: cType, class: cClass, surface: cSurface, parameter: cParam } = counts;
  const { itemType, itemClass, itemSurface, itemParamCount, itemParams } = items;
  for (let i = 0; i < docs.length; i++) {
    const doc = docs[i];
    const f = flags[i];
    if ((f & 14) === 14) cType[itemType[doc]]++;
    const cls = itemClass[doc];
    if ((f & 13) === 13 && cls >= 0) cClass[cls]++;
    const surface = itemSurface[doc];
    if ((f & 11) === 11 && surface >= 0) cSurface[surface]++;
    if ((f & 7) === 7) for (let k = 0, base = doc * MAX_ITEM_PARAMS, n = itemParamCount[doc]; k < n; k++) cParam[itemParams[base + k]]++;
  }
}

/** Per-item data kept in arrays indexed by MiniSearch's short id. */
type Slot = { doc: SearchDocument; type: number; cls: number; surface: number; params: number[] };

/** One term's postings flattened for scoring: item ids, their field-weighted BM25 impact, and whether a headline field holds it. */
type FlatPostings = { gen: number; total: number; docs: Int32Array; impact: Float32Array; headline: Uint8Array };
const MAX_CACHED_TERMS = 4000;
/** Parameters counted per item for facets (the guide schema allows 40). */
const MAX_ITEM_PARAMS = 40;

type Derived = { term: string; data: FieldTermData; weight: number; bit: number; exact: boolean; typed: boolean };

/**
 * The in-memory index with our ranking:
 * 1. query terms are grouped by the synonym table ("drag break" is one group naming drag brake);
 * 2. each group searches its words exactly, by prefix and with typo tolerance, plus its other names;
 * 3. results are ordered first by how many groups they match EXACTLY (a word or one of its names),
 *    then by how many they match in a title, alias, tag, class or surface, then by BM25 score —
 *    so an exact match is never drowned by fuzzy or prefix ones.
 */
export class SearchIndex {
  private mini = this.createMini();
  private docs = new Map<string, SearchDocument>();
  private slots: Array<Slot | undefined> = [];
  private lengths: Float64Array[] = FIELDS.map(() => new Float64Array(1024));
  private score = new Float64Array(1024);
  private mask = new Int32Array(1024);
  private hmask = new Int32Array(1024);
  /** 1 where a typed word (or its typo/prefix variant) matched, not only another name of it. */
  private typed = new Uint8Array(1024);
  // Per-item facet data in flat arrays (indexed by short id): the hot loops stay in cache.
  private alive = new Uint8Array(1024);
  private itemType = new Int8Array(1024);
  private itemClass = new Int8Array(1024);
  private itemSurface = new Int8Array(1024);
  private itemParamCount = new Uint8Array(1024);
  private itemParams = new Uint16Array(1024 * MAX_ITEM_PARAMS);
  private paramIndex = new Map<string, number>();
  private synonyms = new SynonymTable([]);
  private headline = new Map<string, number>();
  private flat = new Map<string, FlatPostings>();
  /**
   * Per-term change counters: adding an item bumps the counters of its terms, so only their
   * flattened postings are rebuilt. Removed items are skipped while scoring; idf and lengths are
   * refreshed once the item count has drifted by 1 %.
   */
  private termGen = new Map<string, number>();
  private params = new Map<string, SearchDocument>();

  private createMini() {
    return new TermIndex<SearchDocument>({
      idField: 'id',
      fields: [...FIELDS],
      storeFields: [],
      extractField: (doc, field) => this.extract(doc, field as Field | 'id'),
      tokenize,
      processTerm: (t) => processTerm(t) ?? null,
      autoVacuum: { minDirtCount: 200, minDirtFactor: 0.1, batchSize: 2000, batchWait: 5 },
    });
  }

  private extract(doc: SearchDocument, field: Field | 'id'): string {
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

  private headlineTerms(doc: SearchDocument) {
    return new Set(toTerms([doc.title, ...doc.aliases, ...doc.tags, this.extract(doc, 'class'), this.extract(doc, 'surface')].join(' ; ')));
  }

  private rebuildSynonyms() {
    const params = [...this.params.values()];
    this.synonyms = new SynonymTable(params.map((p) => ({ slug: p.slug, name: p.title, aliases: p.aliases })));
  }

  private grow(n: number) {
    if (n <= this.score.length) return;
    let size = this.score.length;
    while (size < n) size *= 2;
    const grow = <A extends Float64Array | Int32Array>(a: A, make: (n: number) => A) => {
      const b = make(size);
      b.set(a);
      return b;
    };
    this.score = grow(this.score, (k) => new Float64Array(k));
    this.mask = grow(this.mask, (k) => new Int32Array(k));
    this.hmask = grow(this.hmask, (k) => new Int32Array(k));
    const u8 = (a: Uint8Array, k = 1) => {
      const b = new Uint8Array(size * k);
      b.set(a);
      return b;
    };
    const i8 = (a: Int8Array) => {
      const b = new Int8Array(size);
      b.set(a);
      return b;
    };
    this.typed = u8(this.typed);
    this.alive = u8(this.alive);
    this.itemParamCount = u8(this.itemParamCount);
    this.itemType = i8(this.itemType);
    this.itemClass = i8(this.itemClass);
    this.itemSurface = i8(this.itemSurface);
    const params = new Uint16Array(size * MAX_ITEM_PARAMS);
    params.set(this.itemParams);
    this.itemParams = params;
    this.lengths = this.lengths.map((a) => grow(a, (k) => new Float64Array(k)));
  }

  private paramIdx(slug: string) {
    let i = this.paramIndex.get(slug);
    if (i === undefined) {
      i = this.paramIndex.size;
      this.paramIndex.set(slug, i);
    }
    return i;
  }

  private attach(doc: SearchDocument) {
    const id = docId(doc.type, doc.slug);
    this.docs.set(id, doc);
    if (doc.type === 'parameter') this.params.set(doc.slug, doc);
    for (const t of this.headlineTerms(doc)) this.headline.set(t, (this.headline.get(t) ?? 0) + 1);
    const short = this.mini.shortId(id)!;
    this.grow(short + 1);
    const lens = this.mini.fieldLengths(short) ?? [];
    FIELDS.forEach((f, i) => (this.lengths[i][short] = lens[this.mini.fieldId(f)] ?? 0));
    const slot: Slot = {
      doc,
      type: TYPE_INDEX.get(doc.type) ?? 0,
      cls: doc.class ? (CLASS_INDEX.get(doc.class) ?? -1) : -1,
      surface: doc.surface ? (SURFACE_INDEX.get(doc.surface) ?? -1) : -1,
      params: [...new Set(doc.parameters)].slice(0, MAX_ITEM_PARAMS).map((p) => this.paramIdx(p)),
    };
    this.slots[short] = slot;
    this.alive[short] = 1;
    this.itemType[short] = slot.type;
    this.itemClass[short] = slot.cls;
    this.itemSurface[short] = slot.surface;
    this.itemParamCount[short] = slot.params.length;
    slot.params.forEach((p, k) => (this.itemParams[short * MAX_ITEM_PARAMS + k] = p));
  }

  get size() {
    return this.docs.size;
  }

  has(type: SearchType, slug: string) {
    return this.docs.has(docId(type, slug));
  }

  /** Replaces the whole index (start-up, or after the notification channel was lost). */
  load(docs: SearchDocument[]) {
    this.mini = this.createMini();
    this.flat.clear();
    this.termGen.clear();
    this.params.clear();
    this.docs.clear();
    this.slots = [];
    this.alive.fill(0);
    this.headline.clear();
    const unique = new Map(docs.map((d) => [docId(d.type, d.slug), d]));
    for (const d of unique.values()) {
      this.mini.add(d);
      this.attach(d);
    }
    this.rebuildSynonyms();
  }

  /** Adds or replaces one item. */
  put(doc: SearchDocument) {
    this.remove(doc.type, doc.slug, false);
    for (const f of FIELDS) for (const t of toTerms(this.extract(doc, f))) this.termGen.set(t, (this.termGen.get(t) ?? 0) + 1);
    this.mini.add(doc);
    this.attach(doc);
    if (doc.type === 'parameter') this.rebuildSynonyms();
  }

  /** Removes one item if present. */
  remove(type: SearchType, slug: string, refreshSynonyms = true) {
    const id = docId(type, slug);
    const old = this.docs.get(id);
    if (!old) return false;
    for (const t of this.headlineTerms(old)) {
      const n = (this.headline.get(t) ?? 1) - 1;
      if (n <= 0) this.headline.delete(t);
      else this.headline.set(t, n);
    }
    const short = this.mini.shortId(id);
    if (short !== undefined) {
      this.slots[short] = undefined;
      this.alive[short] = 0;
    }
    this.docs.delete(id);
    if (type === 'parameter') this.params.delete(slug);
    this.mini.discard(id);
    if (type === 'parameter' && refreshSynonyms) this.rebuildSynonyms();
    return true;
  }

  /** The terms to look up for a query: each typed term (with its typo and prefix variants) and each other name. */
  private derive(groups: QueryGroup[], opts: { lastPrefix?: boolean }) {
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
      const data = this.mini.termData(term);
      if (data) derived.push({ term, data, weight, bit, exact: true, typed: isTyped });
      if (!isTyped) continue;
      const rare = this.mini.docFrequency(term) <= KNOWN_WORD_DOCS;
      const last = typed[typed.length - 1] === term;
      const numeric = isNumericTerm(term);
      const prefix = (!!opts.lastPrefix && last) || (rare && (numeric ? /\d$/.test(term) && term.length >= 2 : term.length >= 3));
      const seen = new Set([term]);
      if (prefix) {
        const found = this.mini
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
        for (const [t, d, distance] of this.mini.fuzzyTerms(term, edits)) {
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
    return { derived, forms: Int32Array.from(forms), formGroup: Int32Array.from(formGroup), groupCount: groups.length };
  }

  private flatten(term: string, data: FieldTermData, fields: Field[], scope: string): FlatPostings {
    const key = `${scope}\u0000${term}`;
    const cached = this.flat.get(key);
    const gen = this.termGen.get(term) ?? 0;
    const N = this.mini.total;
    if (cached && cached.gen === gen && Math.abs(cached.total - N) <= cached.total * 0.01) return cached;
    const acc = new Map<number, number>();
    const inHeadline = new Set<number>();
    for (const field of fields) {
      const fid = this.mini.fieldId(field);
      const postings = data.get(fid);
      if (!postings) continue;
      const n = postings.size;
      // Postings of discarded items linger until vacuumed, so n can pass N: keep idf positive.
      const idf = Math.max(0.01, Math.log(1 + (N - n + 0.5) / (n + 0.5)));
      const w = FIELD_BOOST[field] * idf;
      const lens = this.lengths[FIELDS.indexOf(field)];
      const avg = this.mini.avgFieldLength(fid) || 1;
      const headline = HEADLINE_FIELDS.includes(field);
      postings.forEach((tf, doc) => {
        if (this.slots[doc] === undefined) return; // discarded, not yet vacuumed
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

  /** Scores every matching item into the flat arrays; returns the touched short ids. */
  private scoreAll(derived: Derived[], fields: Field[], scope: string): number[] {
    const touched: number[] = [];
    const { score, mask, hmask, typed, alive } = this;
    for (const d of derived) {
      const p = this.flatten(d.term, d.data, fields, scope);
      const bit = 1 << d.bit;
      const w = d.weight;
      const isTyped = d.typed ? 1 : 0;
      const { docs, impact, headline } = p;
      for (let i = 0; i < docs.length; i++) {
        const doc = docs[i];
        if (alive[doc] === 0) continue; // removed since these postings were flattened
        if (score[doc] === 0 && typed[doc] === 0 && mask[doc] === 0) touched.push(doc);
        score[doc] += w * impact[i];
        typed[doc] |= isTyped;
        if (d.exact) {
          mask[doc] |= bit;
          if (headline[i]) hmask[doc] |= bit;
        }
      }
    }
    return touched;
  }

  private run(q: string, opts: { fields?: Field[]; lastPrefix?: boolean; filters?: SearchFilters; limit: number; facets: boolean }) {
    const terms = toTerms(q);
    if (!terms.length) return null;
    const groups = this.synonyms.group(terms);
    const { derived, forms, formGroup, groupCount } = this.derive(groups, opts);
    const seenExact = new Int32Array(groupCount);
    const seenHeadline = new Int32Array(groupCount);
    const named = new Set<number>();
    for (const g of groups)
      for (const slug of g.slugs) {
        const short = this.mini.shortId(docId('parameter', slug));
        if (short !== undefined) named.add(short);
      }
    const touched = this.scoreAll(derived, opts.fields ?? [...FIELDS], opts.fields ? 'headline' : 'all');
    const { score, mask, hmask, typed, slots, itemType, itemClass, itemSurface, itemParamCount, itemParams } = this;
    const namedBoost = groups.length === 1 ? NAMED_PARAMETER_BOOST.whole : NAMED_PARAMETER_BOOST.part;
    for (const doc of named) if (score[doc] > 0) score[doc] *= namedBoost;
    const f = opts.filters ?? {};
    const fType = f.type ? (TYPE_INDEX.get(f.type) ?? -2) : -1;
    const fClass = f.class ? (CLASS_INDEX.get(f.class) ?? -2) : -1;
    const fSurface = f.surface ? (SURFACE_INDEX.get(f.surface) ?? -2) : -1;
    const fParam = f.parameter ? (this.paramIndex.get(f.parameter) ?? -2) : -1;
    const counts = {
      type: new Int32Array(SEARCH_TYPES.length),
      class: new Int32Array(CLASSES.length),
      surface: new Int32Array(SURFACES.length),
      parameter: new Int32Array(this.paramIndex.size),
    };
    const tiers = new Int32Array(touched.length);
    let maxTier = 0;
    let anyExact = false;
    const candidates: number[] = [];
    const included: number[] = [];
    const flags: number[] = [];
    for (let i = 0; i < touched.length; i++) {
      const doc = touched[i];
      const m = mask[doc];
      const hm = hmask[doc];
      let exactGroups = 0;
      let headlineGroups = 0;
      // Stamp with i + 1 so the per-group arrays need no clearing between items.
      const stamp = i + 1;
      for (let k = 0; k < forms.length; k++) {
        const fm = forms[k];
        const g = formGroup[k];
        if ((m & fm) === fm && seenExact[g] !== stamp) {
          seenExact[g] = stamp;
          exactGroups++;
        }
        if ((hm & fm) === fm && seenHeadline[g] !== stamp) {
          seenHeadline[g] = stamp;
          headlineGroups++;
        }
      }
      // Another name alone counts only when all its words are there ("coast" alone is not "coast brake").
      if (!exactGroups && !typed[doc]) continue;
      if (exactGroups) anyExact = true;
      const okType = fType < 0 || itemType[doc] === fType;
      const okClass = fClass < 0 || itemClass[doc] === fClass;
      const okSurface = fSurface < 0 || itemSurface[doc] === fSurface;
      let okParam = fParam < 0;
      if (!okParam) for (let k = 0, base = doc * MAX_ITEM_PARAMS, n = itemParamCount[doc]; k < n; k++) if (itemParams[base + k] === fParam) okParam = true;
      if (opts.facets) {
        included.push(doc);
        flags.push((okType ? 1 : 0) | (okClass ? 2 : 0) | (okSurface ? 4 : 0) | (okParam ? 8 : 0));
      }
      if (okType && okClass && okSurface && okParam) {
        const tier = exactGroups * 64 + headlineGroups;
        tiers[candidates.length] = tier;
        candidates.push(doc);
        if (tier > maxTier) maxTier = tier;
      }
    }
    if (opts.facets) countFacets(included, flags, { itemType, itemClass, itemSurface, itemParamCount, itemParams }, counts);
    // Only the page is ordered: keep the best `limit` by (tier, score) in a small sorted buffer.
    const page: Array<{ doc: number; tier: number }> = [];
    const better = (tier: number, doc: number, than: { doc: number; tier: number }) => tier > than.tier || (tier === than.tier && score[doc] > score[than.doc]);
    for (let i = 0; i < candidates.length; i++) {
      const doc = candidates[i];
      const tier = tiers[i];
      if (page.length >= opts.limit && !better(tier, doc, page[page.length - 1])) continue;
      let at = page.length;
      while (at > 0 && better(tier, doc, page[at - 1])) at--;
      page.splice(at, 0, { doc, tier });
      if (page.length > opts.limit) page.pop();
    }
    const results = page.map(({ doc, tier }) => {
      // Highlight the words typed (or their typo/prefix variants); other names only when none of those occur.
      const typedTerms = new Set<string>();
      const otherTerms = new Set<string>();
      for (const d of derived) for (const postings of d.data.values()) if (postings.has(doc)) (d.typed ? typedTerms : otherTerms).add(d.term);
      const matched = typedTerms.size ? typedTerms : otherTerms;
      return { doc: slots[doc]!.doc, score: score[doc], exact: tier >= 64, matched };
    });
    for (const doc of touched) {
      score[doc] = 0;
      mask[doc] = 0;
      hmask[doc] = 0;
      typed[doc] = 0;
    }
    return { results, total: candidates.length, counts, anyExact };
  }

  /** Ranked hits with facets, snippets and, when nothing matches exactly, a "did you mean". */
  search(q: string, filters: SearchFilters = {}, limit = 10): IndexSearchResult {
    const r = this.run(q, { filters, limit, facets: true });
    const empty = { type: [], class: [], surface: [], parameter: [] };
    if (!r) return { hits: [], facets: empty, total: 0 };
    const hits: SearchHit[] = r.results.map((x) => ({
      type: x.doc.type,
      slug: x.doc.slug,
      title: x.doc.title,
      url: x.doc.url,
      score: Math.round(x.score * 1000) / 1000,
      snippet: this.snippet(x.doc, x.matched),
      exact: x.exact,
    }));
    const list = (arr: Int32Array, value: (i: number) => string, label: (v: string) => string) =>
      [...arr]
        .map((count, i) => ({ value: value(i), count }))
        .filter((x) => x.count > 0)
        .sort((a, b) => b.count - a.count || a.value.localeCompare(b.value))
        .map((x) => ({ value: x.value, label: label(x.value), count: x.count }));
    const paramSlugs = [...this.paramIndex.keys()];
    const facets: SearchFacets = {
      type: list(
        r.counts.type,
        (i) => SEARCH_TYPES[i],
        (v) => TYPE_LABELS[v as SearchType],
      ),
      class: list(
        r.counts.class,
        (i) => CLASSES[i].slug,
        (v) => CLASS_NAMES.get(v) ?? v,
      ),
      surface: list(
        r.counts.surface,
        (i) => SURFACES[i].slug,
        (v) => SURFACE_NAMES.get(v) ?? v,
      ),
      parameter: list(
        r.counts.parameter,
        (i) => paramSlugs[i],
        (v) => this.docs.get(docId('parameter', v))?.title ?? paramWords(v),
      ),
    };
    const didYouMean = r.anyExact ? undefined : this.didYouMean(q);
    return { hits, facets, total: r.total, ...(didYouMean ? { didYouMean } : {}) };
  }

  /** Titles to offer while typing: names, aliases, tags and class words, the last word as a prefix. */
  suggest(q: string, limit = 8): SearchSuggestion[] {
    let r = this.run(q, { fields: SUGGEST_FIELDS, lastPrefix: true, limit, facets: false });
    if (r && !r.results.length) r = this.run(q, { lastPrefix: true, limit, facets: false });
    return (r?.results ?? []).map((x) => ({ type: x.doc.type, slug: x.doc.slug, title: x.doc.title, url: x.doc.url }));
  }

  /**
   * A short passage with the matched words wrapped in <mark>…</mark>. The passage is plain text
   * with any literal mark tags removed, so the client can split on them and render text nodes only.
   */
  snippet(doc: SearchDocument, matched: Set<string>, width = 220): string {
    const sources = [doc.summary, doc.body].filter(Boolean).map((s) => s.replace(/<\/?mark>/gi, ''));
    if (!sources.length) return '';
    // Find candidate places cheaply, then tokenize only the chosen window.
    let best = { text: sources[0], from: 0, score: -1 };
    for (const [i, text] of sources.entries()) {
      const hits = findWords(text.toLowerCase(), matched);
      if (!hits.length && best.score < 0) best = { text, from: 0, score: 0 };
      // The window of `width` characters holding the most distinct matched words, then the most hits.
      for (let a = 0, b = 0; a < hits.length; a++) {
        while (b < hits.length && hits[b].at < hits[a].at + width) b++;
        const distinct = new Set(hits.slice(a, b).map((h) => h.term)).size;
        // Prefer prose to table rows (cells are joined with " · ") when they hold as many words.
        const cells = text.slice(hits[a].at, hits[a].at + width).split(' · ').length - 1;
        const score = distinct * 100 + (b - a) - 3 * cells + (i === 0 ? 1 : 0);
        if (score > best.score) best = { text, from: hits[a].at, score };
      }
    }
    const { text } = best;
    let start = Math.max(0, best.from - 60);
    if (start > 0) {
      const sentence = text.lastIndexOf('. ', best.from);
      start = sentence >= start ? sentence + 2 : text.indexOf(' ', start) + 1;
    }
    let end = Math.min(text.length, start + width + 60);
    if (end < text.length) {
      const space = text.lastIndexOf(' ', end);
      if (space > start) end = space;
    }
    const window = text.slice(start, end);
    let out = start > 0 ? '…' : '';
    let pos = 0;
    for (const s of tokenizeWithSpans(window)) {
      const term = processTerm(s.token);
      if (!term || !matched.has(term)) continue;
      out += window.slice(pos, s.start) + '<mark>' + window.slice(s.start, s.end) + '</mark>';
      pos = s.end;
    }
    out += window.slice(pos) + (end < text.length ? '…' : '');
    return out;
  }

  /**
   * Nearest known name for a query that matched nothing exactly: a parameter name or alias, or a
   * guide title, within a few edits; else the query with each unknown word replaced by the nearest
   * word from titles, names and tags.
   */
  didYouMean(q: string): string | undefined {
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
    for (const { slug, terms: name } of this.synonyms.allNames()) consider(name, this.docs.get(docId('parameter', slug))?.title ?? name.join(' '));
    for (const d of this.docs.values()) if (d.type === 'guide') consider(toTerms(d.title), d.title);
    if (best) return (best as { text: string }).text.toLowerCase() === q.trim().toLowerCase() ? undefined : (best as { text: string }).text;
    let changed = false;
    const fixed = terms.map((t) => {
      if (this.headline.has(t) || isNumericTerm(t)) return t;
      const max = Math.max(1, allowedEdits(t.length));
      let near: { w: string; d: number; n: number } | null = null;
      for (const [w, n] of this.headline) {
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
}
