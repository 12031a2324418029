// What the search page in the browser needs at run time, without zod (the schemas are in schemas/search.ts).

export const SEARCH_TYPES = ['parameter', 'guide', 'setup'] as const;
/** The deepest a results page may start (far past what a reader pages through). */
export const SEARCH_MAX_OFFSET = 10_000;
export type SearchType = (typeof SEARCH_TYPES)[number];

/** Splits a snippet into plain-text segments, marking the highlighted ones (for rendering as text nodes). */
export function snippetSegments(snippet: string): Array<{ text: string; hit: boolean }> {
  const out: Array<{ text: string; hit: boolean }> = [];
  const re = /<mark>(.*?)<\/mark>/gs;
  let last = 0;
  for (const m of snippet.matchAll(re)) {
    if (m.index > last) out.push({ text: snippet.slice(last, m.index), hit: false });
    out.push({ text: m[1], hit: true });
    last = m.index + m[0].length;
  }
  if (last < snippet.length) out.push({ text: snippet.slice(last), hit: false });
  return out;
}
