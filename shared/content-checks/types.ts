import type { ClassSlug } from '../constants';
import type { SetupRecord } from '../schemas/setup-record';

/** How much a finding matters: an error blocks submission, a warning is shown to author and moderator. */
export type CheckSeverity = 'error' | 'warning';

/** One finding of the content checks; `path` names the setting or example concerned (e.g. `gearing.pinionTeeth`, `examples[2].expoPct`). */
export type ContentCheck = { rule: string; severity: CheckSeverity; message: string; path: string };

/** What the checks need to know about one parameter entry of the live library. */
export type CheckLibraryEntry = {
  slug: string;
  name: string;
  unit: string;
  /** The entry's Markdown body: its "Typical settings by class" table gives the class ranges. */
  body: string;
};

/** The content being checked: a guide or parameter revision's fields and its baseline setup, if any. */
export type CheckSubject = {
  body: string;
  class?: ClassSlug | string | null;
  setup?: SetupRecord | null;
};

/** A ```worked-example block of a body, with where it sits (character offsets) and its number (from 0). */
export type ExampleBlock = { index: number; start: number; end: number; source: string };

/** Every ```worked-example block of a Markdown body, in order. */
export function exampleBlocks(body: string): ExampleBlock[] {
  const blocks: ExampleBlock[] = [];
  const re = /^```worked-example[ \t]*\r?\n([\s\S]*?)^```[ \t]*$/gm;
  for (let m = re.exec(body), i = 0; m; m = re.exec(body), i++) {
    blocks.push({ index: i, start: m.index, end: m.index + m[0].length, source: m[1] });
  }
  return blocks;
}

/** Formats a number as the library writes it (no trailing zeros, thousands separated). */
export function formatValue(value: number): string {
  return Number.isInteger(value) ? value.toLocaleString('en-GB') : String(Number(value.toPrecision(6)));
}
