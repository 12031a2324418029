import type { SearchHit, SearchSuggestion, SearchType } from '../../../shared/schemas/search';
import { searchedFor } from './corrections';
import { didYouMean } from './did-you-mean';
import { FacetTable } from './facets';
import { FIELDS, HEADLINE_FIELDS, PostingsCache, TermIndex, fieldText, type Field, type FieldTermData, type Scope } from './postings';
import { ScoreBoard, deriveTerms, termsIn } from './scoring';
import { cutSnippet, snippetSources, type SnippetSource } from './snippets';
import { SynonymTable } from './synonyms';
import { processTerm, tokenize, toTerms } from './tokenizer';
import { docId, paramWords, type IndexSearchResult, type SearchDocument, type SearchFilters } from './types';

export type { IndexSearchResult, SearchDocument, SearchFilters } from './types';

const SUGGEST_FIELDS: Field[] = HEADLINE_FIELDS;
/** A query that is a parameter's own name or alias puts that parameter first; one that only contains it, less so. */
const NAMED_PARAMETER_BOOST = { whole: 4, part: 1.5 };

/** Per-item data the page needs, by MiniSearch's short id. */
type Slot = { doc: SearchDocument; snippet: SnippetSource[] };

/**
 * The in-memory index with our ranking:
 * 1. query terms are grouped by the synonym table ("drag break" is one group naming drag brake);
 * 2. each group searches its words exactly, by prefix and with typo tolerance, plus its other names;
 * 3. results are ordered first by how many groups they match EXACTLY (a word or one of its names),
 *    then by how many they match in a title, alias, tag, class or surface, then by BM25 score —
 *    so an exact match is never drowned by fuzzy or prefix ones.
 *
 * This class coordinates: MiniSearch and the flattened postings (postings.ts), the query's terms and
 * per-item scores (scoring.ts), filters and facet counts (facets.ts), and snippets (snippets.ts).
 */
export class SearchIndex {
  private mini = this.createMini();
  private docs = new Map<string, SearchDocument>();
  private slots: Array<Slot | undefined> = [];
  private postings = new PostingsCache();
  private board = new ScoreBoard();
  private facets = new FacetTable();
  /** How many items the flat per-item arrays hold room for. */
  private capacity = 1024;
  /** One past the highest short id given out (MiniSearch gives each added item a new one). */
  private idLimit = 0;
  private synonyms = new SynonymTable([]);
  /** Words of titles, aliases, tags, classes and surfaces, with how many items hold them (for "did you mean"). */
  private headline = new Map<string, number>();
  private params = new Map<string, SearchDocument>();

  private createMini() {
    return new TermIndex<SearchDocument>({
      idField: 'id',
      fields: [...FIELDS],
      storeFields: [],
      extractField: (doc, field) => fieldText(doc, field as Field | 'id'),
      tokenize,
      processTerm: (t) => processTerm(t) ?? null,
      autoVacuum: { minDirtCount: 200, minDirtFactor: 0.1, batchSize: 2000, batchWait: 5 },
    });
  }

  private headlineTerms(doc: SearchDocument) {
    return new Set(toTerms([doc.title, ...doc.aliases, ...doc.tags, fieldText(doc, 'class'), fieldText(doc, 'surface')].join(' ; ')));
  }

  private rebuildSynonyms() {
    const params = [...this.params.values()];
    this.synonyms = new SynonymTable(params.map((p) => ({ slug: p.slug, name: p.title, aliases: p.aliases })));
  }

  private grow(n: number) {
    if (n <= this.capacity) return;
    let size = this.capacity;
    while (size < n) size *= 2;
    this.capacity = size;
    this.board.grow(size);
    this.facets.grow(size);
    this.postings.grow(size);
  }

  /** `queue`: an item added after the index was built (its terms' cached postings get it appended). */
  private attach(doc: SearchDocument, queue = false) {
    const id = docId(doc.type, doc.slug);
    this.docs.set(id, doc);
    if (doc.type === 'parameter') this.params.set(doc.slug, doc);
    for (const t of this.headlineTerms(doc)) this.headline.set(t, (this.headline.get(t) ?? 0) + 1);
    const short = this.mini.shortId(id)!;
    this.grow(short + 1);
    this.idLimit = Math.max(this.idLimit, short + 1);
    this.postings.attach(this.mini, short, doc, queue);
    this.slots[short] = { doc, snippet: snippetSources(doc) };
    this.facets.attach(short, doc);
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
    this.postings.clear();
    this.params.clear();
    this.docs.clear();
    this.slots = [];
    this.idLimit = 0;
    this.facets.alive.fill(0);
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
    this.mini.add(doc);
    this.attach(doc, true);
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
      this.facets.alive[short] = 0;
    }
    this.docs.delete(id);
    if (type === 'parameter') this.params.delete(slug);
    this.mini.discard(id);
    if (type === 'parameter' && refreshSynonyms) this.rebuildSynonyms();
    return true;
  }

  /** `highlight`: say which terms each hit holds (for snippets; only with every field searched). */
  private run(
    q: string,
    opts: { fields?: Field[]; lastPrefix?: boolean; filters?: SearchFilters; limit: number; offset?: number; facets: boolean; highlight?: boolean },
  ) {
    const terms = toTerms(q);
    if (!terms.length) return null;
    const groups = this.synonyms.group(terms);
    const query = deriveTerms(this.mini, groups, opts);
    const { derived, forms, formGroup } = query;
    const named = new Set<number>();
    for (const g of groups)
      for (const slug of g.slugs) {
        const short = this.mini.shortId(docId('parameter', slug));
        if (short !== undefined) named.add(short);
      }
    const fields = opts.fields ?? [...FIELDS];
    const scope: Scope = opts.fields ? 'headline' : 'all';
    const { mini, postings, board, facets } = this;
    const alive = facets.alive;
    const flatten = (term: string, data: FieldTermData) => postings.get(mini, alive, term, data, fields, scope);
    const touchedCount = board.scoreAll(derived, flatten);
    const { score, mask } = board;
    const namedBoost = groups.length === 1 ? NAMED_PARAMETER_BOOST.whole : NAMED_PARAMETER_BOOST.part;
    for (const doc of named) if (score[doc] > 0) score[doc] *= namedBoost;
    const filter = facets.filterFor(opts.filters ?? {});
    const counts = facets.newCounts();
    const { candidates, anyExact } = facets.collect(board, touchedCount, forms, formGroup, filter, opts.facets ? counts : null);
    const offset = opts.offset ?? 0;
    const page = board.selectPage(candidates, offset + opts.limit);
    const results = (offset ? page.slice(offset) : page).map(({ doc, tier }) => {
      const slot = this.slots[doc]!;
      const matched = opts.highlight ? termsIn(derived, doc, mask[doc]) : new Set<string>();
      return { doc: slot.doc, snippet: slot.snippet, score: score[doc], exact: tier >= 64, matched };
    });
    board.clear(touchedCount, this.idLimit);
    return { results, total: candidates, counts, anyExact, groups, query };
  }

  /**
   * Ranked hits (`limit` of them after the first `offset`) with facets and the total over all
   * matches, snippets, what was searched for when the query was read differently from how it was
   * typed, and, when nothing matches exactly, a "did you mean".
   */
  search(q: string, filters: SearchFilters = {}, limit = 10, offset = 0): IndexSearchResult {
    const r = this.run(q, { filters, limit, offset, facets: true, highlight: true });
    const empty = { type: [], class: [], surface: [], parameter: [] };
    if (!r) return { hits: [], facets: empty, total: 0 };
    const hits: SearchHit[] = r.results.map((x) => ({
      type: x.doc.type,
      slug: x.doc.slug,
      title: x.doc.title,
      url: x.doc.url,
      score: Math.round(x.score * 1000) / 1000,
      snippet: cutSnippet(x.snippet, x.matched),
      exact: x.exact,
    }));
    const facets = this.facets.lists(r.counts, (v) => this.params.get(v)?.title ?? paramWords(v));
    const suggestion = r.anyExact ? undefined : this.didYouMean(q);
    const parameterName = (slug: string) => this.params.get(slug)?.title;
    const corrected = r.total > 0 ? searchedFor(q, r.groups, r.query, { mini: this.mini, parameterName }) : undefined;
    return { hits, facets, total: r.total, ...(suggestion ? { didYouMean: suggestion } : {}), ...(corrected ? { searchedFor: corrected } : {}) };
  }

  /** Titles to offer while typing: names, aliases, tags and class words, the last word as a prefix. */
  suggest(q: string, limit = 8): SearchSuggestion[] {
    let r = this.run(q, { fields: SUGGEST_FIELDS, lastPrefix: true, limit, facets: false });
    if (r && !r.results.length) r = this.run(q, { lastPrefix: true, limit, facets: false });
    return (r?.results ?? []).map((x) => ({ type: x.doc.type, slug: x.doc.slug, title: x.doc.title, url: x.doc.url }));
  }

  /** Nearest known name for a query that matched nothing exactly (see did-you-mean.ts). */
  didYouMean(q: string): string | undefined {
    return didYouMean(q, { synonyms: this.synonyms, docs: this.docs, headline: this.headline });
  }
}
