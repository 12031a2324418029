import type { DocumentKind } from '../../../shared/constants';
import type { HiddenDocument } from '../../../shared/schemas/audit';
import type { AppContext } from '../../context';

/** Every document hidden from readers, most recently hidden first, with who hid it and why (moderators). */
export async function hiddenDocuments(ctx: AppContext): Promise<HiddenDocument[]> {
  const rows: Array<{
    kind: DocumentKind;
    slug: string;
    hidden_at: Date;
    hidden_reason: string | null;
    hidden_by: string | null;
    hidden_by_name: string | null;
    title: string | null;
  }> = await ctx.dataSource.query(
    `SELECT d.kind, d.slug, d.hidden_at, d.hidden_reason, d.hidden_by, u.display_name AS hidden_by_name,
            COALESCE(t.content->>'title', t.content->>'name') AS title
       FROM documents d
       LEFT JOIN users u ON u.id = d.hidden_by
       LEFT JOIN LATERAL (
            SELECT x.content FROM revisions x WHERE x.document_id = d.id
             ORDER BY (x.id = d.published_revision_id) DESC, x.number DESC LIMIT 1
          ) t ON true
      WHERE d.hidden_at IS NOT NULL
      ORDER BY d.hidden_at DESC, d.slug`,
  );
  return rows.map((r) => ({
    kind: r.kind,
    slug: r.slug,
    title: r.title || r.slug,
    hiddenAt: new Date(r.hidden_at).toISOString(),
    hiddenBy: r.hidden_by ? { id: r.hidden_by, displayName: r.hidden_by_name ?? 'Former member' } : null,
    reason: r.hidden_reason,
  }));
}
