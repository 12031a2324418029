import { stripMarkup } from './markdown-text';
import { processTerm, tokenizeWithSpans } from './tokenizer';
import type { SearchDocument } from './types';

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

/** A text a snippet can be cut from: the summary or the body as plain text (no tags, so no literal mark tags either). */
export type SnippetSource = { text: string; cells: number[] };
const NO_CELLS: number[] = [];

/** The texts a snippet is cut from, prepared once when the item is indexed. */
export function snippetSources(doc: SearchDocument): SnippetSource[] {
  return [doc.summary, doc.body].filter(Boolean).map((raw) => {
    // Items are built from plain text already (documents.ts); this also holds for items built elsewhere.
    const text = stripMarkup(raw);
    // Where table cells (joined with " · ") are, so a snippet can prefer prose to table rows.
    const cells: number[] = [];
    for (let at = text.indexOf(' · '); at !== -1; at = text.indexOf(' · ', at + 3)) cells.push(at);
    return { text, cells: cells.length ? cells : NO_CELLS };
  });
}

/**
 * A short passage with the matched words wrapped in <mark>…</mark>. The passage is plain text
 * (markup was stripped when the item was indexed), so the client can split on the marks and
 * render text nodes only, and a client that uses innerHTML is safe too.
 * `sources`: the item's summary and body as kept for snippets (see snippetSources).
 */
export function cutSnippet(sources: SnippetSource[], matched: Set<string>, width = 220): string {
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
