import type { Change, ChangesQuery } from '../../../shared/schemas/change';
import type { AppContext } from '../../context';

type Row = {
  action: 'published' | 'restored' | 'hidden';
  at: Date;
  kind: 'guide' | 'parameter';
  slug: string;
  number: number | null;
  note: string | null;
  content: { title?: string; name?: string; class?: string } | null;
  author_id: string | null;
  author_name: string | null;
  restored_from_number: number | null;
};

/** Shown instead of a moderator's reason to anyone but moderators. */
const HIDDEN_NOTE = 'Taken out of public view by a moderator';

/**
 * Recent live changes: every version that went live (its `published_at`, so seeded history counts
 * too), restores among them, and hides from the audit log. Documents hidden now are left out for
 * everyone but moderators (`asModerator`), who also read the hide reasons.
 */
export function changesService(ctx: AppContext) {
  return {
    async list(q: ChangesQuery, asModerator: boolean): Promise<Change[]> {
      const params: unknown[] = [q.limit, asModerator, q.kind ?? null, q.class ?? null, q.author ?? null];
      const rows: Row[] = await ctx.dataSource.query(
        `WITH events AS (
           SELECT CASE WHEN r.restored_from_number IS NULL THEN 'published' ELSE 'restored' END AS action,
                  r.published_at AS at, r.document_id, r.id AS revision_id, r.note AS note, r.id AS sort_id
             FROM revisions r
            WHERE r.published_at IS NOT NULL AND r.state IN ('published', 'archived')
           UNION ALL
           SELECT 'hidden', a.created_at, a.subject_id, d.published_revision_id, a.reason, a.id
             FROM audit_log a JOIN documents d ON d.id = a.subject_id
            WHERE a.action = 'document.hide'
         )
         SELECT e.action, e.at, d.kind, d.slug, r.number, e.note, r.content, r.author_id, r.restored_from_number,
                u.display_name AS author_name
           FROM events e
           JOIN documents d ON d.id = e.document_id
           LEFT JOIN revisions r ON r.id = e.revision_id
           LEFT JOIN users u ON u.id = r.author_id
          WHERE ($2 OR d.hidden_at IS NULL)
            AND ($3::text IS NULL OR d.kind = $3)
            AND ($4::text IS NULL OR r.content->>'class' = $4)
            AND ($5::uuid IS NULL OR r.author_id = $5)
          ORDER BY e.at DESC, e.sort_id
          LIMIT $1`,
        params,
      );
      return rows.map((r) => ({
        kind: r.kind,
        slug: r.slug,
        title: String(r.content?.title ?? r.content?.name ?? r.slug),
        number: r.number,
        action: r.action,
        at: new Date(r.at).toISOString(),
        note: r.action === 'hidden' && !asModerator ? HIDDEN_NOTE : (r.note ?? (r.action === 'hidden' ? HIDDEN_NOTE : '')),
        class: r.content?.class ?? null,
        author: r.author_id ? { id: r.author_id, displayName: r.author_name ?? 'Former member' } : null,
        restoredFromNumber: r.restored_from_number,
      }));
    },
  };
}
