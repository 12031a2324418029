import type { DataSource, EntityManager } from 'typeorm';
import type { DocumentKind } from '../../../shared/constants';
import { runContentChecks } from '../../../shared/content-checks/run';
import type { CheckLibraryEntry, ContentCheck } from '../../../shared/content-checks/types';
import type { SetupRecord } from '../../../shared/schemas/setup-record';
import { AppError } from '../../lib/errors';

/** The live parameter library as the content checks read it (names, units, class tables in the bodies). */
export async function loadCheckLibrary(db: DataSource | EntityManager): Promise<CheckLibraryEntry[]> {
  const rows: { slug: string; content: Record<string, unknown> }[] = await db.query(
    `SELECT d.slug, r.content FROM documents d JOIN revisions r ON r.id = d.published_revision_id
      WHERE d.kind = 'parameter' AND d.hidden_at IS NULL ORDER BY d.slug`,
  );
  return rows.map(({ slug, content }) => ({ slug, name: String(content.name ?? slug), unit: String(content.unit ?? ''), body: String(content.body ?? '') }));
}

/** Runs the content checks on a revision's content and baseline against the live library. */
export async function checkRevisionContent(
  db: DataSource | EntityManager,
  kind: DocumentKind,
  content: Record<string, unknown>,
  setup: Record<string, unknown> | null,
): Promise<ContentCheck[]> {
  return runContentChecks(
    { body: String(content.body ?? ''), class: kind === 'guide' ? String(content.class ?? '') || null : null, setup: (setup ?? null) as SetupRecord | null },
    await loadCheckLibrary(db),
  );
}

/** 422 listing the blocking findings: a revision with content-check errors cannot be submitted. */
export function contentCheckFailed(checks: ContentCheck[]): AppError {
  const errors = checks.filter((c) => c.severity === 'error');
  return new AppError(
    422,
    'content_check_failed',
    `This revision has ${errors.length === 1 ? 'a problem' : `${errors.length} problems`} to fix before it can be submitted: ${errors.map((e) => e.message).join(' ')}`,
    errors,
  );
}
