import type { FieldIssue } from '../../shared/schemas/common';

const MAX_DEPTH = 64;

/**
 * Finds text PostgreSQL cannot store (the NUL character) and structures nested deeper than any
 * of our schemas go, anywhere in params, query or body; returns one issue per offending place.
 * Without this a stray `%00` reaches the database and fails as a 500 instead of a clear 400.
 */
export function findUnstorableInput(value: unknown, where: string, issues: FieldIssue[] = [], depth = 0): FieldIssue[] {
  if (issues.length >= 20) return issues;
  if (typeof value === 'string') {
    if (value.includes('\u0000')) issues.push({ path: where, message: 'Remove the NUL character (\\u0000): text cannot contain it' });
    return issues;
  }
  if (value === null || typeof value !== 'object') return issues;
  if (depth >= MAX_DEPTH) {
    issues.push({ path: where, message: `Nested more than ${MAX_DEPTH} levels deep` });
    return issues;
  }
  for (const [key, inner] of Object.entries(value)) {
    if (key.includes('\u0000')) issues.push({ path: where, message: 'Remove the NUL character (\\u0000) from the field name' });
    findUnstorableInput(inner, `${where}.${key}`, issues, depth + 1);
  }
  return issues;
}
