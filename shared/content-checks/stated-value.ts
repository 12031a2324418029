import { formatValue, type CheckLibraryEntry, type CheckSubject, type ContentCheck } from './types';

/** How a unit is written after a number in prose, per library unit. */
const unitPatterns: Record<string, string> = {
  '%': '\\s?%',
  V: '\\s?V\\b',
  deg: '\\s?°(?!\\s?[CF])',
  rpm: '\\s?rpm\\b(?!\\s?/)',
  kHz: '\\s?kHz\\b',
  s: '\\s?s\\b',
  A: '\\s?A\\b',
  '°C': '\\s?°C',
};

/** Words between a setting's name and a number that mean the number is not the setting's value now. */
const NOT_THE_VALUE =
  /\b(from|was|were|old|previous|instead|not|back|towards?|above|below|past|over|under|up|down|by|than|beyond|more|less|adds?|raise|lower|steps?|each|per|until|if|when|at|and|or|with|plus|in)\b|[,;(]/i;
/** Words just before a setting's name that make the number a change, not a value ("add drag brake 2 % at a time"). */
const A_CHANGE_BEFORE = /\b(add|adding|take|taking|raise|raising|lower|lowering|drop|dropping|increase|reduce|more|less|extra|another)\s+(the\s+)?$/i;
/** Words just after the number that make it a step size. */
const A_STEP_AFTER = /^\s*(at a time|steps?|increments?|a step|more|less|of (extra|more))\b/i;

function escapeRegExp(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}

/**
 * Rule `stated-value-matches-baseline`: a value the text states for a setting that is in the baseline
 * ("drag brake 4 %", a table row "| Drag brake | 8 % |") is the baseline's value. Only a number written
 * right after the setting's name, with the setting's unit, counts; "raised from 8 % to 12 %" does not.
 */
export function statedValueMatchesBaseline(subject: CheckSubject, library: CheckLibraryEntry[]): ContentCheck[] {
  const setup = subject.setup;
  if (!setup) return [];
  const found: ContentCheck[] = [];
  const seen = new Set<string>();
  for (const [slug, setting] of Object.entries(setup.escSettings)) {
    const entry = library.find((e) => e.slug === slug);
    const unit = entry && unitPatterns[entry.unit];
    if (!entry || !unit) continue;
    const re = new RegExp(
      `\\b${escapeRegExp(entry.name)}\\b([^.\\n\\d]{0,14}?)(-?\\d[\\d,]*(?:\\.\\d+)?)(?:\\s?[–-]\\s?(-?\\d[\\d,]*(?:\\.\\d+)?))?${unit}`,
      'gi',
    );
    for (const m of subject.body.matchAll(re)) {
      const at = m.index ?? 0;
      if (NOT_THE_VALUE.test(m[1]) || A_CHANGE_BEFORE.test(subject.body.slice(Math.max(0, at - 16), at))) continue;
      if (A_STEP_AFTER.test(subject.body.slice(at + m[0].length, at + m[0].length + 20))) continue;
      const stated = Number(m[2].replace(/,/g, ''));
      // A stated range ("0–3 %") holds the baseline when the value lies inside it.
      const upTo = m[3] === undefined ? stated : Number(m[3].replace(/,/g, ''));
      if (setting.value >= stated - 1e-9 && setting.value <= upTo + 1e-9) continue;
      const key = `${slug}:${stated}`;
      if (seen.has(key)) continue;
      seen.add(key);
      found.push({
        rule: 'stated-value-matches-baseline',
        severity: 'error',
        path: `escSettings.${slug}`,
        message: `The text gives ${entry.name.toLowerCase()} as ${formatValue(stated)}${m[3] === undefined ? '' : `–${formatValue(upTo)}`} ${entry.unit} ("${m[0].trim()}") but the baseline has ${formatValue(setting.value)} ${entry.unit}. Make them agree.`,
      });
    }
  }
  return found;
}
