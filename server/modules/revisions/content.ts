import type { z } from 'zod';
import type { DocumentKind } from '../../../shared/constants';
import { contentSchemaFor, draftContentSchemaFor } from '../../../shared/schemas/revision';
import { validationFailed } from '../../lib/errors';
import { toFieldIssues } from '../../lib/route';
import type { RevisionEntity } from './revision.entity';

/** A revision's content (guide or parameter fields), validated by its kind's schema before it is stored. */
export type Content = Record<string, unknown>;

/** Kebab-case slug from a title: ASCII letters and digits, single hyphens, cut at a word boundary. */
export function slugify(text: string, max = 80): string {
  const s = text
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/['’]/g, '')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '');
  if (s.length <= max) return s;
  const cut = s.slice(0, max);
  return cut.includes('-') ? cut.slice(0, cut.lastIndexOf('-')) : cut;
}

/** Guide title or parameter name: what a list row or a mail calls the document. */
export function titleOf(rev: Pick<RevisionEntity, 'content'>): string {
  const c = rev.content as { title?: unknown; name?: unknown };
  return String(c.title ?? c.name ?? '');
}

/**
 * Validates content against the kind's schema (`submit`: everything a reviewer needs; `draft`: what a
 * draft may hold while it is written); problems come back as 400 with paths under `where`.
 */
export function parseContent(kind: DocumentKind, value: unknown, where: string, rules: 'submit' | 'draft' = 'submit'): Content {
  const result = (rules === 'draft' ? draftContentSchemaFor(kind) : contentSchemaFor(kind)).safeParse(value);
  if (!result.success) throw validationFailed(toFieldIssues(result.error, where));
  return result.data as Content;
}

/** Parses a request body whose schema depends on the document's kind (known only once it is read). */
export function parseOrFail<S extends z.ZodType>(schema: S, value: unknown): z.output<S> {
  const result = schema.safeParse(value ?? {});
  if (!result.success) throw validationFailed(toFieldIssues(result.error, 'body'));
  return result.data;
}

/** The edit note and base out of a content body; the rest are the document's fields. */
export function splitInput(input: Record<string, unknown>) {
  const { note, baseRevisionId, ...fields } = input as { note?: string; baseRevisionId?: string } & Content;
  return { note, baseRevisionId, fields };
}
