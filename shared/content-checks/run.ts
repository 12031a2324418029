import { baselineInClassRange } from './baseline-in-class-range';
import { cautionNearExample } from './caution-near-example';
import { exampleMatchesBaseline } from './example-vs-baseline';
import { statedValueMatchesBaseline } from './stated-value';
import type { CheckLibraryEntry, CheckSubject, ContentCheck } from './types';

/** The rules, in the order their findings are listed. */
export const CONTENT_CHECK_RULES = ['example-matches-baseline', 'stated-value-matches-baseline', 'caution-near-example', 'baseline-in-class-range'] as const;

/**
 * Runs every content check on a guide or parameter revision against the live parameter library:
 * errors first, then warnings, each rule's findings in body order. The editor, the server (on every
 * save and submission, and in the review) and the content tests all call this one function.
 */
export function runContentChecks(subject: CheckSubject, library: CheckLibraryEntry[]): ContentCheck[] {
  const all = [
    ...exampleMatchesBaseline(subject),
    ...statedValueMatchesBaseline(subject, library),
    ...cautionNearExample(subject),
    ...baselineInClassRange(subject, library),
  ];
  return [...all.filter((c) => c.severity === 'error'), ...all.filter((c) => c.severity !== 'error')];
}

/** True when any finding blocks submission. */
export function hasBlockingChecks(checks: ContentCheck[]): boolean {
  return checks.some((c) => c.severity === 'error');
}
