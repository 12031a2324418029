import { toTerms } from './tokenizer';

/** One parameter's names as the synonym table sees them. */
export type SynonymSource = { slug: string; name: string; aliases: string[] };

export type Phrase = { terms: string[]; slugs: string[] };

/**
 * A query span recognised as a known name: the terms typed, the parameters it names, and the other
 * names of those parameters to search as well (each an AND of its terms).
 */
export type QueryGroup = { terms: string[]; slugs: string[]; expansions: string[][] };

const MAX_SPAN = 6;

// Class and trade shorthand that are not parameter aliases. Both directions apply.
const TRADE_SYNONYMS: string[][] = [
  ['mod', 'modified'],
  ['sct', 'short course'],
  ['tc', 'touring'],
  ['truggy', 'buggy'],
  ['lipo', 'lithium polymer'],
  ['esc', 'speed controller'],
  ['temp', 'temperature'],
  ['hot', 'heat', 'overheat', 'overheating', 'thermal'],
  ['shut', 'shutdown', 'cutout'],
];

/**
 * The parameter library's names and aliases as synonyms: any name of a parameter typed in a query
 * (as words, hyphenated, or run together: "drag break", "drag-break", "dragbreak") is expanded to all
 * its other names, so "boost" also finds "ramped advance" and the reverse.
 */
export class SynonymTable {
  private phrases = new Map<string, { terms: string[]; slugs: Set<string> }>();
  private bySlug = new Map<string, string[][]>();
  private trade = new Map<string, string[][]>();

  constructor(sources: SynonymSource[]) {
    for (const s of sources) {
      const names: string[][] = [];
      const seen = new Set<string>();
      for (const raw of [s.name, ...s.aliases, s.slug.replace(/-/g, ' ')]) {
        for (const part of raw.split(/\s+\/\s+/)) {
          const terms = toTerms(part);
          if (!terms.length) continue;
          const key = terms.join(' ');
          if (!seen.has(key)) {
            seen.add(key);
            names.push(terms);
          }
          this.addPhrase(key, terms, s.slug);
          if (terms.length > 1) this.addPhrase(terms.join(''), terms, s.slug);
        }
      }
      // Expansions: drop run-together spellings that are one token (they add nothing a reader writes).
      this.bySlug.set(s.slug, names);
    }
    for (const group of TRADE_SYNONYMS) {
      const forms = group.map((g) => toTerms(g));
      for (const f of forms)
        this.trade.set(
          f.join(' '),
          forms.filter((o) => o !== f),
        );
    }
  }

  private addPhrase(key: string, terms: string[], slug: string) {
    const p = this.phrases.get(key) ?? { terms, slugs: new Set<string>() };
    p.slugs.add(slug);
    this.phrases.set(key, p);
  }

  /** Every name and alias of every parameter, as term lists (for "did you mean"). */
  allNames(): Array<{ slug: string; terms: string[] }> {
    const out: Array<{ slug: string; terms: string[] }> = [];
    for (const [slug, names] of this.bySlug) for (const terms of names) out.push({ slug, terms });
    return out;
  }

  /** The main name of a parameter, as terms (the first name registered). */
  primary(slug: string) {
    return this.bySlug.get(slug)?.[0] ?? null;
  }

  /**
   * Groups query terms into spans: the longest run that spells a known name becomes one group with
   * its expansions; every other term is a group of its own (trade shorthand expanded too).
   */
  group(terms: string[]): QueryGroup[] {
    const groups: QueryGroup[] = [];
    let i = 0;
    while (i < terms.length) {
      let found: QueryGroup | null = null;
      for (let len = Math.min(MAX_SPAN, terms.length - i); len >= 1 && !found; len--) {
        const span = terms.slice(i, i + len);
        const phrase = this.phrases.get(span.join(' ')) ?? (len > 1 ? this.phrases.get(span.join('')) : undefined);
        if (!phrase) continue;
        const slugs = [...phrase.slugs];
        const key = span.join(' ');
        const expansions: string[][] = [];
        const seen = new Set([key]);
        for (const slug of slugs) {
          for (const names of this.bySlug.get(slug) ?? []) {
            const k = names.join(' ');
            if (seen.has(k)) continue;
            seen.add(k);
            expansions.push(names);
          }
        }
        found = { terms: span, slugs, expansions };
      }
      if (found) {
        groups.push(found);
        i += found.terms.length;
        continue;
      }
      const t = terms[i];
      groups.push({ terms: [t], slugs: [], expansions: this.trade.get(t) ?? [] });
      i++;
    }
    return groups;
  }
}
