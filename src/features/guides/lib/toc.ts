/** One entry of a guide's table of contents: a heading of its rendered body. */
export type TocEntry = { id: string; text: string; level: 2 | 3 };

const ENTITIES: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'", nbsp: ' ' };

/** The text of a sanitized heading's inner HTML: tags dropped, character references read. */
function headingText(inner: string): string {
  return inner
    .replace(/<[^>]*>/g, '')
    .replace(/&(#x[0-9a-f]+|#[0-9]+|[a-z]+);/gi, (whole, ref: string) => {
      if (ref[0] === '#') {
        const code = ref[1] === 'x' || ref[1] === 'X' ? parseInt(ref.slice(2), 16) : parseInt(ref.slice(1), 10);
        return Number.isFinite(code) && code > 0 && code <= 0x10ffff ? String.fromCodePoint(code) : whole;
      }
      return ENTITIES[ref.toLowerCase()] ?? whole;
    })
    .replace(/\s+/g, ' ')
    .trim();
}

/** An anchor id for a heading, unique on the page: `section-` + the words, lower case, joined by hyphens. */
function anchorId(text: string, taken: Set<string>): string {
  const base =
    'section-' +
    (text
      .toLowerCase()
      .normalize('NFKD')
      .replace(/[\u0300-\u036f]/g, '')
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 60) || 'part');
  let id = base;
  for (let n = 2; taken.has(id); n++) id = `${base}-${n}`;
  taken.add(id);
  return id;
}

/**
 * Gives the h2 and h3 headings of a body the server rendered (and sanitized: headings carry no attributes)
 * anchor ids, and lists them for the table of contents. Runs the same in the browser and in server drawing,
 * so a link to `#section-…` works on the first paint.
 */
export function withHeadingAnchors(html: string): { html: string; entries: TocEntry[] } {
  const entries: TocEntry[] = [];
  const taken = new Set<string>();
  const out = html.replace(/<h([23])>([\s\S]*?)<\/h\1>/g, (_whole, level: string, inner: string) => {
    const text = headingText(inner);
    const id = anchorId(text, taken);
    entries.push({ id, text, level: level === '2' ? 2 : 3 });
    return `<h${level} id="${id}">${inner}</h${level}>`;
  });
  return { html: out, entries };
}
