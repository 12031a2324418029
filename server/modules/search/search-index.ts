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
/** Query terms are tracked as bits of one 32-bit mask (bits 0-29)… */
const MAX_QUERY_TERMS = 30;
/** …and bit 30 marks an item where a typed word (or its typo/prefix variant) matched, not only another name of it. */
const TYPED_BIT = 1 << 30;
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

const LETTER_OR_DIGIT = /[\p{L}\p{N}]/u;
/** A letter or digit in any script; ASCII is decided without the regular expression (the common case). */
function isWordChar(c: string | undefined) {
  if (!c) return false;
  const code = c.charCodeAt(0);
  if (code < 128) return (code >= 48 && code <= 57) || ((code | 32) >= 97 && (code | 32) <= 122);
  return LETTER_OR_DIGIT.test(c);
}

/** A matched term's written forms: "3.2v" is also "3,2 v"; "battery" also "batteries". */
function termNeedles(t: string) {
  const num = /^(\d+(?:\.\d+)?)([a-z%°]+)$/.exec(t);
  const needles = num ? [num[1], num[1].replace('.', ',')] : t.endsWith('y') ? [t, `${t.slice(0, -1)}ies`] : [t];
  return { needles: [...new Set(needles)], unit: num ? num[2] : null };
}

/**
 * Where the written forms of index terms occur in `lower` (already lower-cased): "brake" finds
 * brake and brakes, "battery" batteries, "3.2v" both 3.2V and 3.2 V. indexOf scans are far cheaper
 * than a regex over a long body; the window chosen is tokenized properly afterwards. Each hit is
 * packed as `at * terms.length + term` (term: its index in `terms`), so one numeric sort puts them in text order.
 */
function findWords(lower: string, terms: Array<{ needles: string[]; unit: string | null }>): number[] {
  const out: number[] = [];
  for (let ti = 0; ti < terms.length; ti++) {
    const { needles, unit } = terms[ti];
    for (const needle of needles) {
      for (let at = lower.indexOf(needle); at !== -1; at = lower.indexOf(needle, at + needle.length)) {
        if (isWordChar(lower[at - 1])) continue;
        let end = at + needle.length;
        if (unit !== null) {
          if (lower[end] === ' ' || lower[end] === '-') end++;
          if (!lower.startsWith(unit, end)) continue;
          end += unit.length;
        } else if (lower.startsWith('es', end) && !isWordChar(lower[end + 2])) end += 2;
        else if (lower[end] === 's' && !isWordChar(lower[end + 1])) end += 1;
        if (isWordChar(lower[end])) continue;
        out.push(at * terms.length + ti);
      }
    }
  }
  return out.sort((x, y) => x - y);
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

/** Per-item data kept in arrays indexed by MiniSearch's short id. */
type Slot = { doc: SearchDocument; type: number; cls: number; surface: number; params: number[]; snippet: SnippetSource[] };

/** A text a snippet can be cut from: the summary or the body, with any literal mark tags removed. */
type SnippetSource = { text: string; cells: number[] };
const NO_CELLS: number[] = [];

/** The texts a snippet is cut from, prepared once when the item is indexed. */
function snippetSources(doc: SearchDocument): SnippetSource[] {
  return [doc.summary, doc.body].filter(Boolean).map((raw) => {
    const text = raw.replace(/<\/?mark>/gi, '');
    // Where table cells (joined with " · ") are, so a snippet can prefer prose to table rows.
    const cells: number[] = [];
    for (let at = text.indexOf(' · '); at !== -1; at = text.indexOf(' · ', at + 3)) cells.push(at);
    return { text, cells: cells.length ? cells : NO_CELLS };
  });
}

/** One term's postings flattened for scoring: item ids, their field-weighted BM25 impact, and whether a headline field holds it. */
type FlatPostings = { gen: number; total: number; docs: Int32Array; impact: Float32Array; headline: Uint8Array };
const MAX_CACHED_TERMS = 4000;

/** Bit planes of the parameter facet counter: counts up to 2^31 - 1 items. */
const COUNT_PLANES = 31;

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
  // Reused per query: the items touched by scoring, and the ones that pass the filters with their tier.
  private touchedIds = new Int32Array(1024);
  private candidateIds = new Int32Array(1024);
  private candidateTiers = new Int32Array(1024);
  /** One past the highest short id given out (MiniSearch gives each added item a new one). */
  private idLimit = 0;
  private coverageKeys = new Int32Array(256);
  private coverageValues = new Int32Array(256);
  // Per-item facet data in flat arrays (indexed by short id): the hot loops stay in cache.
  private alive = new Uint8Array(1024);
  private itemType = new Int8Array(1024);
  private itemClass = new Int8Array(1024);
  private itemSurface = new Int8Array(1024);
  /**
   * The parameters an item is about as a bit set of `paramWords` 32-bit words per item: the facet
   * loop adds whole words into bit-sliced counters instead of bumping one counter per parameter.
   */
  private paramWords = 1;
  private itemParamBits = new Int32Array(1024);
  private paramIndex = new Map<string, number>();
  /** The slugs of paramIndex by their number. */
  private paramSlugs: string[] = [];
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
    this.touchedIds = new Int32Array(size);
    this.candidateIds = new Int32Array(size);
    this.candidateTiers = new Int32Array(size);
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
    this.alive = u8(this.alive);
    this.itemType = i8(this.itemType);
    this.itemClass = i8(this.itemClass);
    this.itemSurface = i8(this.itemSurface);
    const params = new Int32Array(size * this.paramWords);
    params.set(this.itemParamBits);
    this.itemParamBits = params;
    this.lengths = this.lengths.map((a) => grow(a, (k) => new Float64Array(k)));
  }

  private paramIdx(slug: string) {
    let i = this.paramIndex.get(slug);
    if (i === undefined) {
      i = this.paramIndex.size;
      this.paramIndex.set(slug, i);
      this.paramSlugs.push(slug);
      if (i >= this.paramWords * 32) this.widenParamBits();
    }
    return i;
  }

  /** One more word per item for the parameter bit sets (every 32 distinct parameters). */
  private widenParamBits() {
    const from = this.paramWords;
    const to = from + 1;
    const size = this.itemParamBits.length / from;
    const bits = new Int32Array(size * to);
    for (let short = 0; short < size; short++) for (let w = 0; w < from; w++) bits[short * to + w] = this.itemParamBits[short * from + w];
    this.paramWords = to;
    this.itemParamBits = bits;
  }

  private attach(doc: SearchDocument) {
    const id = docId(doc.type, doc.slug);
    this.docs.set(id, doc);
    if (doc.type === 'parameter') this.params.set(doc.slug, doc);
    for (const t of this.headlineTerms(doc)) this.headline.set(t, (this.headline.get(t) ?? 0) + 1);
    const short = this.mini.shortId(id)!;
    this.grow(short + 1);
    this.idLimit = Math.max(this.idLimit, short + 1);
    const lens = this.mini.fieldLengths(short) ?? [];
    FIELDS.forEach((f, i) => (this.lengths[i][short] = lens[this.mini.fieldId(f)] ?? 0));
    const slot: Slot = {
      doc,
      type: TYPE_INDEX.get(doc.type) ?? 0,
      cls: doc.class ? (CLASS_INDEX.get(doc.class) ?? -1) : -1,
      surface: doc.surface ? (SURFACE_INDEX.get(doc.surface) ?? -1) : -1,
      params: [...new Set(doc.parameters)].map((p) => this.paramIdx(p)),
      snippet: snippetSources(doc),
    };
    this.slots[short] = slot;
    this.alive[short] = 1;
    this.itemType[short] = slot.type;
    this.itemClass[short] = slot.cls;
    this.itemSurface[short] = slot.surface;
    const words = this.paramWords;
    this.itemParamBits.fill(0, short * words, (short + 1) * words);
    for (const p of slot.params) this.itemParamBits[short * words + (p >>> 5)] |= 1 << (p & 31);
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
    this.idLimit = 0;
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

  /**
   * How many query groups a term mask covers (some form of the group has all its terms in the mask),
   * as a function remembered per mask: the items of one query share a handful of masks. A small
   * direct-mapped table, since a Map lookup per item costs more than the counting it saves.
   */
  private coverage(forms: Int32Array, formGroup: Int32Array) {
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
   * Scores every matching item into the flat arrays. The touched short ids go to `touchedIds`
   * (a reused buffer, so a query allocates nothing per item); returns how many there are.
   */
  private scoreAll(derived: Derived[], fields: Field[], scope: string): number {
    const { score, mask, hmask, touchedIds } = this;
    let n = 0;
    for (const d of derived) {
      const p = this.flatten(d.term, d.data, fields, scope);
      const bit = d.exact ? 1 << d.bit : 0;
      const typedBit = d.typed ? TYPED_BIT : 0;
      const w = d.weight;
      const { docs, impact, headline } = p;
      // Items removed since these postings were flattened are scored too and dropped once, in run().
      for (let i = 0; i < docs.length; i++) {
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

  /** `highlight`: say which terms each hit holds (for snippets; only with every field searched). */
  private run(q: string, opts: { fields?: Field[]; lastPrefix?: boolean; filters?: SearchFilters; limit: number; facets: boolean; highlight?: boolean }) {
    const terms = toTerms(q);
    if (!terms.length) return null;
    const groups = this.synonyms.group(terms);
    const { derived, forms, formGroup } = this.derive(groups, opts);
    const named = new Set<number>();
    for (const g of groups)
      for (const slug of g.slugs) {
        const short = this.mini.shortId(docId('parameter', slug));
        if (short !== undefined) named.add(short);
      }
    const touchedCount = this.scoreAll(derived, opts.fields ?? [...FIELDS], opts.fields ? 'headline' : 'all');
    const { score, mask, slots } = this;
    const namedBoost = groups.length === 1 ? NAMED_PARAMETER_BOOST.whole : NAMED_PARAMETER_BOOST.part;
    for (const doc of named) if (score[doc] > 0) score[doc] *= namedBoost;
    const f = opts.filters ?? {};
    // -1: no filter; -2: a value nothing has (matches no item).
    const filter = {
      type: f.type ? (TYPE_INDEX.get(f.type) ?? -2) : -1,
      class: f.class ? (CLASS_INDEX.get(f.class) ?? -2) : -1,
      surface: f.surface ? (SURFACE_INDEX.get(f.surface) ?? -2) : -1,
      parameter: f.parameter ? (this.paramIndex.get(f.parameter) ?? -2) : -1,
    };
    const counts: FacetCounts = {
      type: new Int32Array(SEARCH_TYPES.length),
      class: new Int32Array(CLASSES.length),
      surface: new Int32Array(SURFACES.length),
      parameter: new Int32Array(this.paramIndex.size),
    };
    const { candidates, anyExact } = this.collect(touchedCount, forms, formGroup, filter, opts.facets ? counts : null);
    const results = this.selectPage(candidates, opts.limit).map(({ doc, tier }) => {
      const slot = slots[doc]!;
      const matched = opts.highlight ? this.termsIn(derived, doc, mask[doc]) : new Set<string>();
      return { doc: slot.doc, snippet: slot.snippet, score: score[doc], exact: tier >= 64, matched };
    });
    this.clearScores(touchedCount);
    return { results, total: candidates, counts, anyExact };
  }

  /**
   * One pass over the touched items: drops removed items and those only another name reached
   * partly, applies the filters, counts the facets (when `counts` is given) and writes the
   * candidates with their tier to candidateIds/candidateTiers. Kept apart from run() so its loop is
   * optimised on its own (a rarely taken branch elsewhere in a long function kept the whole of it
   * falling back to the interpreter).
   */
  private collect(
    touchedCount: number,
    forms: Int32Array,
    formGroup: Int32Array,
    filter: { type: number; class: number; surface: number; parameter: number },
    counts: FacetCounts | null,
  ) {
    // Made here rather than passed in, so the compiler can inline it into the loop.
    const coverage = this.coverage(forms, formGroup);
    const { mask, hmask, alive, itemType, itemClass, itemSurface, itemParamBits, paramWords, touchedIds, candidateIds, candidateTiers } = this;
    const { type: fType, class: fClass, surface: fSurface, parameter: fParam } = filter;
    // Filters are tested with `|` on both sides, so every comparison runs whatever the filter.
    const anyType = fType === -1 ? 1 : 0;
    const anyClass = fClass === -1 ? 1 : 0;
    const anySurface = fSurface === -1 ? 1 : 0;
    const anyParam = fParam === -1 ? 1 : 0;
    const paramWord = fParam >= 0 ? fParam >>> 5 : 0;
    const paramBit = fParam >= 0 ? fParam & 31 : 0;
    const paramKnown = fParam >= 0 ? 1 : 0;
    const withFacets = counts !== null;
    const cType = counts?.type ?? new Int32Array(0);
    const cClass = counts?.class ?? new Int32Array(0);
    const cSurface = counts?.surface ?? new Int32Array(0);
    // The parameter facet is counted in bit-sliced form: plane j holds bit j of every parameter's count.
    const planes = new Int32Array(paramWords * COUNT_PLANES);
    let anyExact = false;
    let candidates = 0;
    for (let i = 0; i < touchedCount; i++) {
      const doc = touchedIds[i];
      if (alive[doc] === 0) continue; // removed since its postings were flattened
      const m = mask[doc];
      const exactGroups = coverage(m);
      // Another name alone counts only when all its words are there ("coast" alone is not "coast brake").
      if (!exactGroups && (m & TYPED_BIT) === 0) continue;
      if (exactGroups) anyExact = true;
      const base = doc * paramWords;
      const okType = anyType | (itemType[doc] === fType ? 1 : 0);
      const okClass = anyClass | (itemClass[doc] === fClass ? 1 : 0);
      const okSurface = anySurface | (itemSurface[doc] === fSurface ? 1 : 0);
      const okParam = anyParam | (paramKnown & (itemParamBits[base + paramWord] >>> paramBit));
      if (withFacets) {
        // Each facet is counted with the other facets' filters applied but not its own, so a reader can switch value.
        if (okClass & okSurface & okParam) cType[itemType[doc]]++;
        const cls = itemClass[doc];
        if (cls >= 0 && okType & okSurface & okParam) cClass[cls]++;
        const surface = itemSurface[doc];
        if (surface >= 0 && okType & okClass & okParam) cSurface[surface]++;
        if (okType & okClass & okSurface)
          for (let w = 0; w < paramWords; w++) {
            // Add the item's parameter word to the counters: a ripple carry, two steps on average.
            let carry = itemParamBits[base + w];
            for (let j = w * COUNT_PLANES; carry !== 0; j++) {
              const next = planes[j] & carry;
              planes[j] ^= carry;
              carry = next;
            }
          }
      }
      if (okType & okClass & okSurface & okParam) {
        candidateTiers[candidates] = exactGroups * 64 + coverage(hmask[doc]);
        candidateIds[candidates++] = doc;
      }
    }
    if (counts)
      for (let p = 0; p < counts.parameter.length; p++) {
        const from = (p >>> 5) * COUNT_PLANES;
        const bit = p & 31;
        let n = 0;
        for (let j = 0; j < COUNT_PLANES; j++) n += ((planes[from + j] >>> bit) & 1) << j;
        counts.parameter[p] = n;
      }
    return { candidates, anyExact };
  }

  /** The best `limit` candidates by (tier, score), kept in a small sorted buffer: only the page is ordered. */
  private selectPage(candidates: number, limit: number) {
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

  /**
   * The terms a hit holds, for its snippet: the words typed (or their typo/prefix variants), else
   * the other names. Scoring already noted each exact term's bit in `m` (over every field); only
   * typo and prefix variants need a look-up.
   */
  private termsIn(derived: Derived[], doc: number, m: number) {
    const typedTerms = new Set<string>();
    const otherTerms = new Set<string>();
    for (const d of derived) {
      const holds = d.exact ? ((m >>> d.bit) & 1) === 1 : [...d.data.values()].some((postings) => postings.has(doc));
      if (holds) (d.typed ? typedTerms : otherTerms).add(d.term);
    }
    return typedTerms.size ? typedTerms : otherTerms;
  }

  /** Back to all zeros for the next query. */
  private clearScores(touchedCount: number) {
    const { score, mask, hmask, touchedIds } = this;
    if (touchedCount * 4 > this.idLimit) {
      // Most items were touched: clearing whole ranges is cheaper than one store per item and array.
      score.fill(0, 0, this.idLimit);
      mask.fill(0, 0, this.idLimit);
      hmask.fill(0, 0, this.idLimit);
      return;
    }
    for (let i = 0; i < touchedCount; i++) {
      const doc = touchedIds[i];
      score[doc] = 0;
      mask[doc] = 0;
      hmask[doc] = 0;
    }
  }

  /** Ranked hits with facets, snippets and, when nothing matches exactly, a "did you mean". */
  search(q: string, filters: SearchFilters = {}, limit = 10): IndexSearchResult {
    const r = this.run(q, { filters, limit, facets: true, highlight: true });
    const empty = { type: [], class: [], surface: [], parameter: [] };
    if (!r) return { hits: [], facets: empty, total: 0 };
    const hits: SearchHit[] = r.results.map((x) => ({
      type: x.doc.type,
      slug: x.doc.slug,
      title: x.doc.title,
      url: x.doc.url,
      score: Math.round(x.score * 1000) / 1000,
      snippet: this.snippet(x.snippet, x.matched),
      exact: x.exact,
    }));
    const list = (arr: Int32Array, value: (i: number) => string, label: (v: string) => string) =>
      [...arr]
        .map((count, i) => ({ value: value(i), count }))
        .filter((x) => x.count > 0)
        .sort((a, b) => b.count - a.count || a.value.localeCompare(b.value))
        .map((x) => ({ value: x.value, label: label(x.value), count: x.count }));
    const { paramSlugs } = this;
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
        (v) => this.params.get(v)?.title ?? paramWords(v),
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
   * `sources`: the item's summary and body as kept for snippets (see snippetSources).
   */
  private snippet(sources: SnippetSource[], matched: Set<string>, width = 220): string {
    if (!sources.length) return '';
    const terms = [...matched].map(termNeedles);
    const K = terms.length || 1;
    const seen = new Int32Array(terms.length);
    // Find candidate places cheaply, then tokenize only the chosen window.
    let best = { text: sources[0].text, from: 0, score: -1 };
    for (let i = 0; i < sources.length; i++) {
      const { text, cells: cellAt } = sources[i];
      const lower = text.toLowerCase();
      const hits = findWords(lower, terms);
      if (!hits.length && best.score < 0) best = { text, from: 0, score: 0 };
      // The window of `width` characters holding the most distinct matched words, then the most hits.
      for (let a = 0, b = 0, c0 = 0, c1 = 0; a < hits.length; a++) {
        const from = Math.floor(hits[a] / K);
        while (b < hits.length && Math.floor(hits[b] / K) < from + width) b++;
        let distinct = 0;
        for (let k = a; k < b; k++) {
          const t = hits[k] % K;
          if (seen[t] !== a + 1) {
            seen[t] = a + 1;
            distinct++;
          }
        }
        // Prefer prose to table rows (cells are joined with " · ") when they hold as many words.
        while (c0 < cellAt.length && cellAt[c0] < from) c0++;
        if (c1 < c0) c1 = c0;
        while (c1 < cellAt.length && cellAt[c1] + 3 <= from + width) c1++;
        const cells = c1 - c0;
        const score = distinct * 100 + (b - a) - 3 * cells + (i === 0 ? 1 : 0);
        if (score > best.score) best = { text, from, score };
      }
      seen.fill(0);
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
    // A term keeps its token's first character (processTerm only trims endings), so most tokens are ruled out by it.
    const firsts = [...matched].map((t) => t.charCodeAt(0));
    for (const s of tokenizeWithSpans(window)) {
      if (!firsts.includes(s.token.charCodeAt(0))) continue;
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
