/**
 * Plain text of a Markdown body for the search index and snippets: headings, emphasis, link targets,
 * table rules and HTML go; link texts, table cells and list items stay. Worked-example blocks keep
 * only the calculator name (their numbers are not prose).
 */
export function markdownToText(md: string): string {
  const lines: string[] = [];
  let fence: string | null = null;
  let worked = false;
  for (const raw of md.replace(/\r\n?/g, '\n').split('\n')) {
    const fenceMatch = /^\s*(```+|~~~+)\s*([\w-]*)/.exec(raw);
    if (fence) {
      if (fenceMatch && fenceMatch[1].startsWith(fence) && !fenceMatch[2]) fence = null;
      else if (worked && /^\s*calc:\s*([\w-]+)/.test(raw)) lines.push(`${raw.replace(/^\s*calc:\s*/, '').trim()} worked example.`);
      continue;
    }
    if (fenceMatch) {
      fence = fenceMatch[1];
      worked = fenceMatch[2] === 'worked-example';
      continue;
    }
    let line = raw;
    if (/^\s*\|?\s*:?-{3,}:?\s*(\|\s*:?-{3,}:?\s*)*\|?\s*$/.test(line)) continue; // table rule
    line = line
      .replace(/<[^>]+>/g, ' ')
      .replace(/^\s{0,3}#{1,6}\s+/, '')
      .replace(/^\s{0,3}>\s?/, '')
      .replace(/^\s*([-*+]|\d+[.)])\s+(\[[ xX]\]\s+)?/, '')
      .replace(/!\[([^\]]*)\]\([^)]*\)/g, '$1')
      .replace(/\[([^\]]+)\]\([^)]*\)/g, '$1')
      .replace(/\[([^\]]+)\]\[[^\]]*\]/g, '$1')
      .replace(/`([^`]*)`/g, '$1')
      .replace(/(\*\*|__)(.+?)\1/g, '$2')
      .replace(/(^|[\s(])[*_]([^*_\s][^*_]*?)[*_](?=[\s).,;:!?]|$)/g, '$1$2')
      .replace(/~~(.+?)~~/g, '$1')
      .replace(/\s*\|\s*/g, ' · ')
      .replace(/^ · | · $/g, '')
      .trim();
    if (/^[-*_]{3,}$/.test(line)) continue;
    lines.push(line);
  }
  // Blank lines end a paragraph; keep them as sentence breaks so snippets don't run headings into text.
  // Tags were removed line by line above; one spread over lines is removed from the whole text.
  const text = lines
    .join('\n')
    .replace(/\n{2,}/g, '\n')
    .split('\n')
    .filter((l) => l.length > 0)
    .map((l) => (/[.!?:;·]$/.test(l) ? l : `${l}.`))
    .join(' ')
    .replace(/\s+/g, ' ')
    .trim();
  return stripMarkup(text);
}

/**
 * Plain text of a user's text for the index and its snippets: HTML tags and comments go (also one
 * spread over lines or left open at the end), and a "<" that could still open a tag is dropped, so a
 * snippet is plain text for every client, even one that puts it into innerHTML. Text without "<" is
 * returned as it is.
 */
export function stripMarkup(text: string): string {
  if (!text.includes('<')) return text;
  return text
    .replace(/<!--[\s\S]*?(?:-->|$)/g, ' ')
    .replace(/<\/?[a-z][^>]*(?:>|$)/gi, ' ')
    .replace(/<(?=[a-z/!?])/gi, '')
    .replace(/[ \t]{2,}/g, ' ')
    .trim();
}
