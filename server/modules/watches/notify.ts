import type { EntityManager } from 'typeorm';
import { documentPath } from '../../../shared/paths';
import type { AppContext } from '../../context';
import { UserEntity } from '../auth/user.entity';
import type { DocumentEntity } from '../revisions/document.entity';
import { RevisionEntity } from '../revisions/revision.entity';
import { titleOf } from '../revisions/presenter';
import { changeMail, hiddenNoticeMail } from './mail';
import { unsubscribeLinks } from './links';
import { WatchDigestItemEntity, WatchEntity, type WatchedChange } from './watch.entity';

/**
 * Authors watch what they write: called when someone starts a document or a new version of one. A
 * person who stopped watching keeps their choice (the row stays with watching = false).
 */
export async function watchOwnWork(m: EntityManager, userId: string, documentId: string) {
  await m.query(`INSERT INTO watches (user_id, document_id) VALUES ($1, $2) ON CONFLICT (user_id, document_id) DO NOTHING`, [userId, documentId]);
}

export type LiveChange = {
  doc: DocumentEntity;
  /** The revision that went live (published, restored); for a hide, the live one (read here when null). */
  revision: RevisionEntity | null;
  action: WatchedChange['action'];
  actorId: string;
  /** The moderator's reason for a hide (told to the author only). */
  reason?: string | null;
};

/**
 * Tells the watchers of a document that it changed, inside the transaction of the change: a mail each
 * for those who want them at once, a digest row for the daily ones. The person who made the change,
 * and the author of a newly published or restored version (who has their own mail), are not told. A
 * hide also sends the document's author a notice with the reason, watching or not.
 */
export async function notifyWatchers(ctx: AppContext, m: EntityManager, e: LiveChange) {
  const { doc } = e;
  const rev = e.revision ?? (doc.publishedRevisionId ? await m.getRepository(RevisionEntity).findOneBy({ id: doc.publishedRevisionId }) : null);
  if (!rev) return;
  const base = e.action !== 'hidden' && rev.baseRevisionId ? await m.getRepository(RevisionEntity).findOneBy({ id: rev.baseRevisionId }) : null;
  const actor = await m.getRepository(UserEntity).findOneBy({ id: e.actorId });
  const appUrl = ctx.config.appUrl;
  const page = `${appUrl}${documentPath(doc.kind, doc.slug)}`;
  const change: WatchedChange = {
    kind: doc.kind,
    slug: doc.slug,
    title: titleOf(rev),
    number: rev.number,
    action: e.action,
    note: e.action === 'hidden' ? '' : rev.note,
    actorName: actor?.displayName ?? 'A moderator',
    // Parameter entries have no side-by-side page yet: their mails point at the entry and its history.
    diffUrl: base && doc.kind === 'guide' ? `${page}/compare?from=${base.number}&to=${rev.number}` : null,
    pageUrl: e.action === 'hidden' ? page : `${page}${doc.kind === 'guide' ? `/v/${rev.number}` : ''}`,
    at: new Date().toISOString(),
  };
  const skip = new Set([
    e.actorId,
    ...(e.action === 'published' || e.action === 'restored' ? [rev.authorId] : []),
    ...(e.action === 'hidden' && doc.createdBy ? [doc.createdBy] : []),
  ]);
  const rows: Array<{ id: string; email: string; display_name: string; delivery: string | null }> = await m.query(
    `SELECT u.id, u.email, u.display_name, p.delivery
       FROM watches w
       JOIN users u ON u.id = w.user_id
       LEFT JOIN watch_preferences p ON p.user_id = u.id
      WHERE w.document_id = $1 AND w.watching AND u.disabled_at IS NULL AND u.email_verified_at IS NOT NULL`,
    [doc.id],
  );
  for (const row of rows) {
    if (skip.has(row.id)) continue;
    const delivery = row.delivery ?? 'immediate';
    if (delivery === 'off') continue;
    if (delivery === 'daily') {
      await m.getRepository(WatchDigestItemEntity).insert({ userId: row.id, documentId: doc.id, change });
      continue;
    }
    await ctx.mailer.send(changeMail({ email: row.email, displayName: row.display_name }, change, unsubscribeLinks(ctx, row.id, doc.id)), m);
  }
  if (e.action === 'hidden' && doc.createdBy && doc.createdBy !== e.actorId) {
    const author = await m.getRepository(UserEntity).findOneBy({ id: doc.createdBy });
    if (author && !author.disabledAt) await ctx.mailer.send(hiddenNoticeMail(author, change, e.reason ?? 'No reason was given.'), m);
  }
}

/** Whether this person watches this document (for the watch button). */
export async function isWatching(m: EntityManager, userId: string, documentId: string) {
  return !!(await m.getRepository(WatchEntity).findOneBy({ userId, documentId, watching: true }));
}
