import { CLASSES, SURFACES } from '../../../shared/constants';
import { SEARCH_TYPES, type SearchFacets, type SearchType } from '../../../shared/schemas/search';
import { CLASS_NAMES, SURFACE_NAMES } from './postings';
import { TYPED_BIT, type ScoreBoard } from './scoring';
import type { SearchDocument, SearchFilters } from './types';

const TYPE_LABELS: Record<SearchType, string> = { parameter: 'Parameter', guide: 'Guide', setup: 'Setup' };
const CLASS_INDEX = new Map<string, number>(CLASSES.map((c, i) => [c.slug, i]));
const SURFACE_INDEX = new Map<string, number>(SURFACES.map((s, i) => [s.slug, i]));
const TYPE_INDEX = new Map<string, number>(SEARCH_TYPES.map((t, i) => [t, i]));

/** Bit planes of the parameter facet counter: counts up to 2^31 - 1 items. */
const COUNT_PLANES = 31;

export type FacetCounts = { type: Int32Array; class: Int32Array; surface: Int32Array; parameter: Int32Array };
/** Filter values as indexes: -1 no filter; -2 a value nothing has (matches no item). */
export type FacetFilter = { type: number; class: number; surface: number; parameter: number };

/**
 * Per-item facet data in flat arrays indexed by short id, so the hot loop stays in cache; and the
 * one pass that filters the scored items and counts every facet over all matches.
 */
export class FacetTable {
  alive = new Uint8Array(1024);
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

  grow(size: number) {
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

  /** Records a newly added item (its short id already within capacity). */
  attach(short: number, doc: SearchDocument) {
    const type = TYPE_INDEX.get(doc.type) ?? 0;
    const cls = doc.class ? (CLASS_INDEX.get(doc.class) ?? -1) : -1;
    const surface = doc.surface ? (SURFACE_INDEX.get(doc.surface) ?? -1) : -1;
    const params = [...new Set(doc.parameters)].map((p) => this.paramIdx(p));
    this.alive[short] = 1;
    this.itemType[short] = type;
    this.itemClass[short] = cls;
    this.itemSurface[short] = surface;
    const words = this.paramWords;
    this.itemParamBits.fill(0, short * words, (short + 1) * words);
    for (const p of params) this.itemParamBits[short * words + (p >>> 5)] |= 1 << (p & 31);
  }

  filterFor(f: SearchFilters): FacetFilter {
    return {
      type: f.type ? (TYPE_INDEX.get(f.type) ?? -2) : -1,
      class: f.class ? (CLASS_INDEX.get(f.class) ?? -2) : -1,
      surface: f.surface ? (SURFACE_INDEX.get(f.surface) ?? -2) : -1,
      parameter: f.parameter ? (this.paramIndex.get(f.parameter) ?? -2) : -1,
    };
  }

  newCounts(): FacetCounts {
    return {
      type: new Int32Array(SEARCH_TYPES.length),
      class: new Int32Array(CLASSES.length),
      surface: new Int32Array(SURFACES.length),
      parameter: new Int32Array(this.paramIndex.size),
    };
  }

  /**
   * One pass over the touched items: drops removed items and those only another name reached
   * partly, applies the filters, counts the facets (when `counts` is given) and writes the
   * candidates with their tier to the board's candidateIds/candidateTiers. Kept apart from the query
   * so its loop is optimised on its own (a rarely taken branch elsewhere in a long function kept the
   * whole of it falling back to the interpreter).
   */
  collect(board: ScoreBoard, touchedCount: number, forms: Int32Array, formGroup: Int32Array, filter: FacetFilter, counts: FacetCounts | null) {
    // Made here rather than passed in, so the compiler can inline it into the loop.
    const coverage = board.coverage(forms, formGroup);
    const { mask, hmask, touchedIds, candidateIds, candidateTiers } = board;
    const { alive, itemType, itemClass, itemSurface, itemParamBits, paramWords } = this;
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

  /** The counts as the API lists them: values with a count, most first; `parameterTitle` names a parameter slug. */
  lists(counts: FacetCounts, parameterTitle: (slug: string) => string): SearchFacets {
    const list = (arr: Int32Array, value: (i: number) => string, label: (v: string) => string) =>
      [...arr]
        .map((count, i) => ({ value: value(i), count }))
        .filter((x) => x.count > 0)
        .sort((a, b) => b.count - a.count || a.value.localeCompare(b.value))
        .map((x) => ({ value: x.value, label: label(x.value), count: x.count }));
    const { paramSlugs } = this;
    return {
      type: list(
        counts.type,
        (i) => SEARCH_TYPES[i],
        (v) => TYPE_LABELS[v as SearchType],
      ),
      class: list(
        counts.class,
        (i) => CLASSES[i].slug,
        (v) => CLASS_NAMES.get(v) ?? v,
      ),
      surface: list(
        counts.surface,
        (i) => SURFACES[i].slug,
        (v) => SURFACE_NAMES.get(v) ?? v,
      ),
      parameter: list(counts.parameter, (i) => paramSlugs[i], parameterTitle),
    };
  }
}
