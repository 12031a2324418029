import Papa from 'papaparse';
import { paths, documentPath } from '../../../shared/paths';
import type { DocumentKind } from '../../../shared/constants';
import { AUDIT_CSV_MAX_ROWS, auditActionLabel, type AuditEntry, type AuditFilter, type AuditQuery } from '../../../shared/schemas/audit';
import type { AppContext } from '../../context';

type Row = {
  id: string;
  created_at: Date;
  actor_id: string | null;
  actor_name: string | null;
  action: string;
  subject_kind: string;
  subject_id: string;
  from_value: string | null;
  to_value: string | null;
  reason: string | null;
  rev_number: number | null;
  rev_state: string | null;
  doc_kind: DocumentKind | null;
  doc_slug: string | null;
  doc_title: string | null;
  user_name: string | null;
};

/** WHERE clause and parameters of the filters (all bound, nothing from the request is spliced into SQL). */
function where(f: AuditFilter): { sql: string; params: unknown[] } {
  const parts: string[] = [];
  const params: unknown[] = [];
  const add = (clause: (n: string) => string, value: unknown) => {
    params.push(value);
    parts.push(clause(`$${params.length}`));
  };
  if (f.actor) add((n) => `a.actor_id = ${n}`, f.actor);
  if (f.action) add((n) => `a.action = ${n}`, f.action);
  if (f.targetType) add((n) => `a.subject_kind = ${n}`, f.targetType);
  if (f.targetId) add((n) => `a.subject_id = ${n}`, f.targetId);
  // Whole days in UTC, both ends included.
  if (f.since) add((n) => `a.created_at >= (${n}::date)::timestamp AT TIME ZONE 'UTC'`, f.since);
  if (f.until) add((n) => `a.created_at < ((${n}::date + 1)::timestamp AT TIME ZONE 'UTC')`, f.until);
  return { sql: parts.length ? `WHERE ${parts.join(' AND ')}` : '', params };
}

// Each row with what it is about in words: the revision's or document's title (a document's from its
// live version, else its newest), an image's guide, an account's display name.
const SELECT = `
  SELECT a.id, a.created_at, a.actor_id, au.display_name AS actor_name, a.action, a.subject_kind, a.subject_id,
         a.from_value, a.to_value, a.reason,
         r.number AS rev_number, r.state AS rev_state,
         d.kind AS doc_kind, d.slug AS doc_slug,
         COALESCE(r.content->>'title', r.content->>'name', t.content->>'title', t.content->>'name') AS doc_title,
         su.display_name AS user_name
    FROM audit_log a
    LEFT JOIN users au ON au.id = a.actor_id
    LEFT JOIN revisions r ON a.subject_kind = 'revision' AND r.id = a.subject_id
    LEFT JOIN documents d ON d.id = CASE
         WHEN a.subject_kind = 'revision' THEN r.document_id
         WHEN a.subject_kind = 'document' THEN a.subject_id
         WHEN a.subject_kind = 'image' AND a.meta->>'documentId' ~ '^[0-9a-f-]{36}$' THEN (a.meta->>'documentId')::uuid
       END
    LEFT JOIN LATERAL (
         SELECT x.content FROM revisions x WHERE a.subject_kind <> 'revision' AND x.document_id = d.id
          ORDER BY (x.id = d.published_revision_id) DESC, x.number DESC LIMIT 1
       ) t ON true
    LEFT JOIN users su ON a.subject_kind = 'user' AND su.id = a.subject_id`;

function targetOf(r: Row): { target: string; targetHref: string | null } {
  if (r.subject_kind === 'user') return { target: r.user_name ?? 'Former member', targetHref: null };
  if (!r.doc_kind || !r.doc_slug) return { target: '(no longer exists)', targetHref: null };
  const title = r.doc_title || r.doc_slug;
  if (r.subject_kind === 'revision' && r.rev_number != null) {
    const readable = r.rev_state === 'published' || r.rev_state === 'archived';
    const href = readable ? paths.documentVersion(r.doc_kind, r.doc_slug, r.rev_number) : r.rev_state === 'in_review' ? paths.review(r.subject_id) : null;
    return { target: `${title} (version ${r.rev_number})`, targetHref: href };
  }
  if (r.subject_kind === 'image') return { target: `Image in ${title}`, targetHref: documentPath(r.doc_kind, r.doc_slug) };
  return { target: title, targetHref: documentPath(r.doc_kind, r.doc_slug) };
}

function present(r: Row): AuditEntry {
  return {
    id: r.id,
    at: new Date(r.created_at).toISOString(),
    // A row whose actor's account row is gone reads as a former member; no actor at all stays null.
    actor: r.actor_id ? { id: r.actor_id, displayName: r.actor_name ?? 'Former member' } : null,
    action: r.action,
    actionLabel: auditActionLabel(r.action),
    targetType: r.subject_kind,
    targetId: r.subject_id,
    ...targetOf(r),
    from: r.from_value,
    to: r.to_value,
    reason: r.reason,
  };
}

const CSV_FIELDS = ['Time (UTC)', 'Who', 'Who (id)', 'Action', 'Action code', 'About', 'About (type)', 'About (id)', 'From', 'To', 'Reason'];

export function auditService(ctx: AppContext) {
  const ds = ctx.dataSource;
  return {
    /** One page of the log, newest first, with the total that matches the filters. */
    async list(q: AuditQuery) {
      const w = where(q);
      const [count] = await ds.query(`SELECT count(*)::int AS n FROM audit_log a ${w.sql}`, w.params);
      const rows: Row[] = await ds.query(
        `${SELECT} ${w.sql} ORDER BY a.created_at DESC, a.seq DESC LIMIT $${w.params.length + 1} OFFSET $${w.params.length + 2}`,
        [...w.params, q.limit, q.offset],
      );
      return { rows: rows.map(present), total: Number(count.n) };
    },

    /**
     * The matching rows as CSV, newest first, at most AUDIT_CSV_MAX_ROWS of them. Every cell that a
     * spreadsheet would read as a formula (=, +, -, @, tab, carriage return first) is prefixed with a
     * quote by papaparse's escapeFormulae, so a title like `=HYPERLINK(…)` stays text.
     */
    async csv(f: AuditFilter) {
      const w = where(f);
      const [count] = await ds.query(`SELECT count(*)::int AS n FROM audit_log a ${w.sql}`, w.params);
      const rows: Row[] = await ds.query(`${SELECT} ${w.sql} ORDER BY a.created_at DESC, a.seq DESC LIMIT ${AUDIT_CSV_MAX_ROWS}`, w.params);
      const data = rows
        .map(present)
        .map((e) => [
          e.at,
          e.actor?.displayName ?? '(no account)',
          e.actor?.id ?? '',
          e.actionLabel,
          e.action,
          e.target,
          e.targetType,
          e.targetId,
          e.from ?? '',
          e.to ?? '',
          e.reason ?? '',
        ]);
      const text = Papa.unparse({ fields: CSV_FIELDS, data }, { escapeFormulae: true, newline: '\r\n' });
      return { text, total: Number(count.n), rows: data.length };
    },
  };
}
