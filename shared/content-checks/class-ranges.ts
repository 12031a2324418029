import { CLASSES } from '../constants';
import type { CheckLibraryEntry } from './types';

/** A class's typical range as a parameter entry's table states it. */
export type ClassRange = { min: number; max: number; text: string };

const classByName = new Map<string, string>(CLASSES.map((c) => [c.name.toLowerCase(), c.slug]));
const cache = new Map<string, Map<string, ClassRange>>();

function parseNumber(text: string): number {
  return Number(text.replace(/,/g, '').replace('−', '-').replace(/^\+/, ''));
}

/**
 * The "Typical settings by class" table of a parameter entry, as class slug → numeric range. A cell
 * such as "Default, 100–120 °C" or "Off, or 8,000–20,000 rpm" gives its first range; a single number
 * gives that number; cells without a number ("Default", "Forward and brake") give nothing.
 */
export function classRanges(entry: CheckLibraryEntry): Map<string, ClassRange> {
  const cached = cache.get(entry.body);
  if (cached) return cached;
  const ranges = new Map<string, ClassRange>();
  const section = entry.body.split(/^## Typical settings by class\s*$/m)[1]?.split(/^## /m)[0] ?? '';
  for (const line of section.split('\n')) {
    const cells = line.split('|').map((c) => c.trim());
    if (cells.length < 4) continue;
    const slug = classByName.get(cells[1].toLowerCase());
    if (!slug) continue;
    const span = cells[2].match(/([-+−]?\d[\d,]*(?:\.\d+)?)\s*(?:[–-]|to)\s*([-+−]?\d[\d,]*(?:\.\d+)?)/);
    const single = cells[2].match(/^(-?\d[\d,]*(?:\.\d+)?)\b/);
    if (span) ranges.set(slug, { min: parseNumber(span[1]), max: parseNumber(span[2]), text: cells[2] });
    else if (single) ranges.set(slug, { min: parseNumber(single[1]), max: parseNumber(single[1]), text: cells[2] });
  }
  if (cache.size > 500) cache.clear();
  cache.set(entry.body, ranges);
  return ranges;
}

/** The "Typical settings by class" cells of an entry as written, class slug → text ("Forward and brake", "0–10 %"). */
export function classTypicalTexts(body: string): Map<string, string> {
  const texts = new Map<string, string>();
  const section = body.split(/^## Typical settings by class\s*$/m)[1]?.split(/^## /m)[0] ?? '';
  for (const line of section.split('\n')) {
    const cells = line.split('|').map((c) => c.trim());
    if (cells.length < 4) continue;
    const slug = classByName.get(cells[1].toLowerCase());
    if (slug && cells[2]) texts.set(slug, cells[2]);
  }
  return texts;
}
