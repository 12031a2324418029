/**
 * Resolving a three-way merge by hand. The server sends the body as regions of lines — merged lines,
 * or a conflicting hunk with the live text ("theirs") and the draft's ("ours") — plus metadata fields
 * both sides changed. The author picks per conflict; these helpers build the resolved content.
 */

/** A run of a word diff (live → draft inside a conflict; draft → merged for what comes in). */
export type WordPart = { value: string; added?: boolean; removed?: boolean };

export type MergeRegion =
  { kind: 'ok'; lines: string[] } | { kind: 'conflict'; hunk: number; base: string[]; ours: string[]; theirs: string[]; words?: WordPart[] };
export type ConflictRegion = Extract<MergeRegion, { kind: 'conflict' }>;

/** A field conflict (for the body, one entry per hunk; `hunk` says which). */
export type FieldConflict = { field: string; hunk?: number; base: unknown; ours: unknown; theirs: unknown };

export type ConflictChoice = { pick: 'theirs' } | { pick: 'ours' } | { pick: 'custom'; text: string };

/** The lines a choice stands for. */
export function choiceLines(region: ConflictRegion, choice: ConflictChoice): string[] {
  if (choice.pick === 'theirs') return region.theirs;
  if (choice.pick === 'ours') return region.ours;
  return choice.text === '' ? [] : choice.text.split('\n');
}

/**
 * Joins the regions into a body: merged lines as they are, each conflict as its chosen side.
 * A conflict without a choice keeps the draft's lines (nothing the author wrote is dropped) and
 * counts as unresolved.
 */
export function resolveBody(regions: MergeRegion[], choices: Record<number, ConflictChoice | undefined>): { body: string; unresolved: number } {
  const lines: string[] = [];
  let unresolved = 0;
  for (const r of regions) {
    if (r.kind === 'ok') {
      lines.push(...r.lines);
      continue;
    }
    const choice = choices[r.hunk];
    if (!choice) unresolved++;
    lines.push(...choiceLines(r, choice ?? { pick: 'ours' }));
  }
  return { body: lines.join('\n'), unresolved };
}

/**
 * The merged metadata with each conflicting field set to the chosen side (the server's `merged`
 * already holds the draft's value for every conflict).
 */
export function resolveFields(
  merged: Record<string, unknown>,
  conflicts: FieldConflict[],
  choices: Record<string, 'theirs' | 'ours' | undefined>,
): { content: Record<string, unknown>; unresolved: number } {
  const content = { ...merged };
  let unresolved = 0;
  for (const c of conflicts) {
    if (c.field === 'body') continue;
    const choice = choices[c.field];
    if (!choice) unresolved++;
    content[c.field] = choice === 'theirs' ? c.theirs : c.ours;
  }
  return { content, unresolved };
}

/** A starting point for editing a hunk by hand: the live lines, then the draft's. */
export function handEditStart(region: ConflictRegion): string {
  return [...region.theirs, ...region.ours].join('\n');
}

/**
 * Cuts the unchanged stretches of a word diff down to the paragraphs (lines) around each change, so
 * a few merged sentences in a long guide read at a glance. A dropped stretch becomes a "⋯" line.
 */
export function aroundChanges(parts: WordPart[]): WordPart[] {
  if (!parts.some((p) => p.added || p.removed)) return parts;
  const out: WordPart[] = [];
  parts.forEach((p, i) => {
    if (p.added || p.removed) {
      out.push(p);
      return;
    }
    const after = i > 0; // something changed just before this stretch
    const before = i < parts.length - 1; // something changes just after it
    const lines = p.value.split('\n');
    if (lines.length <= 2) {
      out.push(p);
      return;
    }
    const head = after ? lines[0] : null;
    const tail = before ? lines[lines.length - 1] : null;
    out.push({ value: [head, '⋯', tail].filter((x) => x !== null).join('\n') });
  });
  return out;
}
