import MiniSearch, { type Query, type SearchOptions, type SearchResult } from 'minisearch';
import { CLASSES, SURFACES } from '../../../shared/constants';
import type { SearchFacets, SearchHit, SearchResponse, SearchSuggestion, SearchType } from '../../../shared/schemas/search';
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

const FIELDS = ['title', 'aliases', 'summary', 'body', 'tags', 'class', 'surface', 'parameters'] as const;
type Field = (typeof FIELDS)[number];

/** Field weights: what a page is called counts most, then how it is described, then its text. */
export const FIELD_BOOST: Record<Field, number> = { title: 8, aliases: 7, summary: 2.5, body: 1, tags: 3, class: 2.5, surface: 2.5, parameters: 1.2 };
const SUGGEST_FIELDS: Field[] = ['title', 'aliases', 'tags', 'class', 'surface'];
/** A query that is a parameter's own name or alias puts that parameter first; one that only contains it, less so. */
const NAMED_PARAMETER_BOOST = { whole: 4, part: 1.5 };
/** Other names of what was typed count, but less than the words typed. */
const EXPANSION_WEIGHT = 0.6;
const WEIGHTS = { fuzzy: 0.35, prefix: 0.5 };

const CLASS_NAMES = new Map<string, string>(CLASSES.map((c) => [c.slug, c.name]));
const SURFACE_NAMES = new Map<string, string>(SURFACES.map((s) => [s.slug, s.name]));
const TYPE_LABELS: Record<SearchType, string> = { parameter: 'Parameter', guide: 'Guide', setup: 'Setup' };

const docId = (type: SearchType, slug: string) => `${type}:${slug}`;
const paramWords = (slug: string) => slug.replace(/-/g, ' ');

function fuzzyFor(term: string) {
  if (isNumericTerm(term)) return false;
  return allowedEdits(term.length) || false;
}
function prefixFor(term: string) {
  return isNumericTerm(term) ? /\d$/.test(term) && term.length >= 2 : term.length >= 3;
}

type Ranked = { doc: SearchDocument; score: number; exactGroups: number; headlineGroups: number; terms: string[] };

/** Fields that say what a page is (rather than what it mentions). */
const HEADLINE_FIELDS = new Set<string>(['title', 'aliases', 'tags', 'class', 'surface']);

/**
 * The in-memory index (MiniSearch) with our ranking on top:
 * 1. query terms are grouped by the synonym table ("drag break" is one group naming drag brake);
 * 2. each group searches its words exactly, by prefix and with typo tolerance, plus its other names;
 * 3. results are ordered first by how many groups they match EXACTLY (a word or one of its names),
 *    then by score — so an exact match is never drowned by fuzzy or prefix ones.
 */
export class SearchIndex {
  private mini = this.createMini();
  private docs = new Map<string, SearchDocument>();
  private synonyms = new SynonymTable([]);
  private headline = new Map<string, number>();

  private createMini() {
    return new MiniSearch<SearchDocument>({
      idField: 'id',
      fields: [...FIELDS],
      storeFields: [],
      extractField: (doc, field) => this.extract(doc, field as Field | 'id'),
      tokenize,
      processTerm: (t) => processTerm(t) ?? null,
      searchOptions: { tokenize, processTerm: (t) => processTerm(t) ?? null },
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
    const params = [...this.docs.values()].filter((d) => d.type === 'parameter');
    this.synonyms = new SynonymTable(params.map((p) => ({ slug: p.slug, name: p.title, aliases: p.aliases })));
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
    this.docs.clear();
    this.headline.clear();
    for (const d of docs) {
      this.docs.set(docId(d.type, d.slug), d);
      for (const t of this.headlineTerms(d)) this.headline.set(t, (this.headline.get(t) ?? 0) + 1);
    }
    this.mini.addAll([...this.docs.values()]);
    this.rebuildSynonyms();
  }

  /** Adds or replaces one item. */
  put(doc: SearchDocument) {
    this.remove(doc.type, doc.slug);
    this.docs.set(docId(doc.type, doc.slug), doc);
    for (const t of this.headlineTerms(doc)) this.headline.set(t, (this.headline.get(t) ?? 0) + 1);
    this.mini.add(doc);
    if (doc.type === 'parameter') this.rebuildSynonyms();
  }

  /** Removes one item if present. */
  remove(type: SearchType, slug: string) {
    const id = docId(type, slug);
    const old = this.docs.get(id);
    if (!old) return false;
    for (const t of this.headlineTerms(old)) {
      const n = (this.headline.get(t) ?? 1) - 1;
      if (n <= 0) this.headline.delete(t);
      else this.headline.set(t, n);
    }
    this.docs.delete(id);
    this.mini.discard(id);
    if (type === 'parameter') this.rebuildSynonyms();
    return true;
  }

  private buildQuery(groups: QueryGroup[], opts: { lastPrefix?: boolean }): Query {
    const all = groups.flatMap((g) => g.terms);
    const queries: Query[] = [
      {
        queries: all,
        fuzzy: (t) => fuzzyFor(t),
        prefix: (t, i) => prefixFor(t) || (!!opts.lastPrefix && i === all.length - 1 && !isNumericTerm(t)),
      },
    ];
    for (const g of groups) {
      for (const e of g.expansions) queries.push({ combineWith: 'AND', queries: e, fuzzy: false, prefix: false, boostTerm: () => EXPANSION_WEIGHT });
    }
    return { combineWith: 'OR', queries };
  }

  private rank(q: string, opts: { fields?: Field[]; lastPrefix?: boolean } = {}): { groups: QueryGroup[]; ranked: Ranked[] } {
    const terms = toTerms(q);
    if (!terms.length) return { groups: [], ranked: [] };
    const groups = this.synonyms.group(terms);
    const named = new Set(groups.flatMap((g) => g.slugs.map((s) => docId('parameter', s))));
    const namedBoost = groups.length === 1 ? NAMED_PARAMETER_BOOST.whole : NAMED_PARAMETER_BOOST.part;
    const options: SearchOptions = {
      fields: opts.fields,
      boost: FIELD_BOOST,
      weights: WEIGHTS,
      tokenize: (s) => [s],
      processTerm: (t) => t,
      boostDocument: named.size ? (id) => (named.has(id) ? namedBoost : 1) : undefined,
    };
    const results = this.mini.search(this.buildQuery(groups, opts), options);
    const ranked: Ranked[] = [];
    for (const r of results as SearchResult[]) {
      const doc = this.docs.get(r.id);
      if (!doc) continue;
      const matched = new Set(r.terms);
      const inHeadline = (t: string) => r.match[t]?.some((f) => HEADLINE_FIELDS.has(f)) ?? false;
      let exactGroups = 0;
      let headlineGroups = 0;
      for (const g of groups) {
        const forms = [g.terms, ...g.expansions];
        if (forms.some((e) => e.every((t) => matched.has(t)))) exactGroups++;
        if (forms.some((e) => e.every((t) => matched.has(t) && inHeadline(t)))) headlineGroups++;
      }
      ranked.push({ doc, score: r.score, exactGroups, headlineGroups, terms: r.terms });
    }
    // Exact before fuzzy/prefix; then pages that ARE about the words before pages that mention them.
    ranked.sort((a, b) => b.exactGroups - a.exactGroups || b.headlineGroups - a.headlineGroups || b.score - a.score);
    return { groups, ranked };
  }

  /** Ranked hits with facets, snippets and, when nothing matches exactly, a "did you mean". */
  search(q: string, filters: SearchFilters = {}, limit = 20): Omit<SearchResponse, 'tookMs'> & { total: number } {
    const { ranked } = this.rank(q);
    const pass = (d: SearchDocument, skip?: keyof SearchFilters) =>
      (skip === 'type' || !filters.type || d.type === filters.type) &&
      (skip === 'class' || !filters.class || d.class === filters.class) &&
      (skip === 'surface' || !filters.surface || d.surface === filters.surface) &&
      (skip === 'parameter' || !filters.parameter || d.parameters.includes(filters.parameter));
    const filtered = ranked.filter((r) => pass(r.doc));
    const facets = this.facets(ranked, pass);
    const hits: SearchHit[] = filtered.slice(0, limit).map((r) => ({
      type: r.doc.type,
      slug: r.doc.slug,
      title: r.doc.title,
      url: r.doc.url,
      score: Math.round(r.score * 1000) / 1000,
      snippet: this.snippet(r.doc, new Set(r.terms)),
      exact: r.exactGroups > 0,
    }));
    const anyExact = ranked.some((r) => r.exactGroups > 0);
    const didYouMean = anyExact ? undefined : this.didYouMean(q);
    return { hits, facets, total: filtered.length, ...(didYouMean ? { didYouMean } : {}) };
  }

  /** Titles to offer while typing: names, aliases, tags and class words, the last word as a prefix. */
  suggest(q: string, limit = 8): SearchSuggestion[] {
    let { ranked } = this.rank(q, { fields: SUGGEST_FIELDS, lastPrefix: true });
    if (!ranked.length) ranked = this.rank(q, { lastPrefix: true }).ranked;
    return ranked.slice(0, limit).map((r) => ({ type: r.doc.type, slug: r.doc.slug, title: r.doc.title, url: r.doc.url }));
  }

  private facets(ranked: Ranked[], pass: (d: SearchDocument, skip?: keyof SearchFilters) => boolean): SearchFacets {
    // Each facet is counted with the other facets' filters applied but not its own, so a reader can switch value.
    const count = (skip: keyof SearchFilters, values: (d: SearchDocument) => Array<string | null>) => {
      const m = new Map<string, number>();
      for (const r of ranked) {
        if (!pass(r.doc, skip)) continue;
        for (const v of new Set(values(r.doc))) if (v) m.set(v, (m.get(v) ?? 0) + 1);
      }
      return [...m.entries()].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0]));
    };
    const paramName = (slug: string) => this.docs.get(docId('parameter', slug))?.title ?? paramWords(slug);
    return {
      type: count('type', (d) => [d.type]).map(([value, n]) => ({ value, label: TYPE_LABELS[value as SearchType], count: n })),
      class: count('class', (d) => [d.class]).map(([value, n]) => ({ value, label: CLASS_NAMES.get(value) ?? value, count: n })),
      surface: count('surface', (d) => [d.surface]).map(([value, n]) => ({ value, label: SURFACE_NAMES.get(value) ?? value, count: n })),
      parameter: count('parameter', (d) => d.parameters).map(([value, n]) => ({ value, label: paramName(value), count: n })),
    };
  }

  /**
   * A short passage with the matched words wrapped in <mark>…</mark>. The passage is plain text
   * with any literal mark tags removed, so the client can split on them and render text nodes only.
   */
  snippet(doc: SearchDocument, matched: Set<string>, width = 220): string {
    const sources = [doc.summary, doc.body].map((s) => s.replace(/<\/?mark>/gi, ''));
    let best = { text: sources[0] || sources[1] || '', spans: [] as Array<{ start: number; end: number }>, score: -1, from: 0 };
    for (const text of sources) {
      if (!text) continue;
      const spans = tokenizeWithSpans(text).filter((t) => {
        const p = processTerm(t.token);
        return p !== null && matched.has(p);
      });
      if (!spans.length) {
        if (best.score < 0) best = { text, spans: [], score: 0, from: 0 };
        continue;
      }
      // The window of `width` characters holding the most distinct matched words, then the most hits.
      for (let i = 0; i < spans.length; i++) {
        const from = spans[i].start;
        const inWin = spans.filter((s) => s.start >= from && s.end <= from + width);
        const distinct = new Set(inWin.map((s) => processTerm(text.slice(s.start, s.end).toLowerCase()))).size;
        const score = distinct * 100 + inWin.length + (text === sources[0] ? 1 : 0);
        if (score > best.score) best = { text, spans: inWin, score, from };
      }
    }
    const { text, spans } = best;
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
    let out = start > 0 ? '…' : '';
    let pos = start;
    for (const s of spans) {
      if (s.start < pos || s.end > end) continue;
      out += text.slice(pos, s.start) + '<mark>' + text.slice(s.start, s.end) + '</mark>';
      pos = s.end;
    }
    out += text.slice(pos, end) + (end < text.length ? '…' : '');
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
