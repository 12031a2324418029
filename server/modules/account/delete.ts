import crypto from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { FORMER_MEMBER_NAME } from '../../../shared/schemas/account';
import type { AppContext } from '../../context';
import { notifyDocumentChanged } from '../../lib/document-events';
import { AppError, validationFailed } from '../../lib/errors';
import { hashPassword, verifyPassword } from '../../lib/passwords';
import { AuditLogEntity } from '../audit/audit-log.entity';
import { endSessions } from '../auth/service';
import { signInKey } from '../auth/sign-in-throttle';
import { UserEntity } from '../auth/user.entity';
import { publishedCache } from '../revisions/read-cache';
import { accountDeletedMail } from './mail';
import type { DocumentKind } from '../../../shared/constants';

/** The address a deleted account's row keeps: unique, unroutable (RFC 2606 `.invalid`), and no one's. */
export const formerMemberEmail = (id: string) => `former-member-${id}@deleted.invalid`;

type Touched = { kind: DocumentKind; slug: string; id: string };

/**
 * Deletes the caller's account in one transaction: private data goes (drafts and proposals, never-live
 * guides, setups, runs that are not evidence on a published version, motors and bench checks, watches,
 * tokens, sessions), the row stays under a neutral name with no credentials so the published versions
 * it wrote keep an author, and the confirmation mail is queued in the same transaction. The stored
 * files are removed after the commit (the start-up sweep catches any that a crash leaves behind).
 */
export async function deleteAccount(ctx: AppContext, userId: string, currentPassword: string) {
  const ds = ctx.dataSource;
  const me = await ds.getRepository(UserEntity).findOneByOrFail({ id: userId });
  if (!(await verifyPassword(currentPassword, me.passwordHash)))
    throw validationFailed([{ path: 'body.currentPassword', message: 'That is not your current password' }], 'That is not your current password');
  // No one can sign in with this: a hash of random bytes nobody keeps.
  const unusableHash = await hashPassword(crypto.randomBytes(32).toString('base64url'), ctx.config.bcryptCost);

  const { keys, touched } = await ds.transaction(async (m) => {
    // Every admin row locked in one order, so two administrators deleting themselves at once cannot both pass the check.
    const admins: Array<{ id: string; active: boolean }> = await m.query(
      `SELECT id, (disabled_at IS NULL AND deleted_at IS NULL) AS active FROM users WHERE role = 'admin' ORDER BY id FOR UPDATE`,
    );
    const user = await m.getRepository(UserEntity).createQueryBuilder('u').where('u.id = :id', { id: userId }).setLock('pessimistic_write').getOne();
    if (!user || user.deletedAt) throw new AppError(404, 'not_found', 'That account was not found');
    if (user.role === 'admin' && !admins.some((a) => a.id !== userId && a.active))
      throw new AppError(409, 'last_admin', 'You are the only administrator. Make someone else an administrator first, then delete your account.');
    const oldEmail = user.email;
    const keys = await removePrivateData(m, userId);

    // Documents whose pages credit this person: their cached copies must drop the old name.
    const touched: Touched[] = await m.query(
      `SELECT DISTINCT d.kind, d.slug, d.id FROM revisions r JOIN documents d ON d.id = r.document_id
        WHERE r.author_id = $1 AND r.state IN ('published', 'archived')`,
      [userId],
    );
    const [{ n: published }] = await m.query(`SELECT count(*)::int AS n FROM revisions WHERE author_id = $1 AND state IN ('published', 'archived')`, [userId]);

    const at = new Date();
    await m.getRepository(UserEntity).update(
      { id: userId },
      {
        email: formerMemberEmail(userId),
        displayName: FORMER_MEMBER_NAME,
        passwordHash: unusableHash,
        role: 'member',
        emailVerifiedAt: null,
        disabledAt: at,
        deletedAt: at,
      },
    );
    await m.query(`DELETE FROM user_tokens WHERE user_id = $1`, [userId]);
    await m.query(`DELETE FROM sign_in_attempts WHERE email_key = $1`, [signInKey(oldEmail)]);
    await endSessions(m, userId);
    await m.getRepository(AuditLogEntity).insert({
      actorId: userId,
      action: 'user.delete',
      subjectKind: 'user',
      subjectId: userId,
      from: 'active',
      to: 'deleted',
      reason: null,
      meta: { publishedKept: Number(published) },
    });
    for (const d of touched) await notifyDocumentChanged(m, { kind: d.kind, documentId: d.id, slug: d.slug, action: 'author-left' });
    await ctx.mailer.send(accountDeletedMail(oldEmail, { at, published: Number(published) }), m);
    return { keys, touched };
  });

  for (const d of touched) publishedCache(ctx).invalidate(d.kind, d.slug);
  for (const key of keys)
    await ctx.storage.delete(key).catch((err: unknown) => ctx.logger.error({ err, key }, 'account deletion: could not remove a stored file'));
}

/** Removes what is the person's alone; returns the storage keys to delete once the transaction commits. */
async function removePrivateData(m: EntityManager, userId: string): Promise<string[]> {
  // Guides that never went live exist only for their author: the whole document goes (its revisions, images and watches with it).
  await m.query(`DELETE FROM documents WHERE created_by = $1 AND published_revision_id IS NULL`, [userId]);
  // Drafts, proposals waiting for review and sent-back versions of live documents.
  await m.query(`DELETE FROM revisions WHERE author_id = $1 AND state IN ('draft', 'in_review', 'returned')`, [userId]);
  // Runs stay only where a published or superseded version shows them as evidence (part of that version).
  const runs = deleted<{ raw_key: string; data_key: string }>(
    await m.query(
      `DELETE FROM runs r WHERE r.owner_id = $1 AND NOT EXISTS (
        SELECT 1 FROM run_evidence e JOIN revisions v ON v.id = e.revision_id WHERE e.run_id = r.id AND v.state IN ('published', 'archived'))
      RETURNING raw_key, data_key`,
      [userId],
    ),
  );
  const setups = deleted<{ storage_key: string }>(await m.query(`DELETE FROM setups WHERE owner_id = $1 RETURNING storage_key`, [userId]));
  await m.query(`DELETE FROM motors WHERE owner_id = $1`, [userId]);
  await m.query(`DELETE FROM watch_digest_items WHERE user_id = $1`, [userId]);
  await m.query(`DELETE FROM watches WHERE user_id = $1`, [userId]);
  await m.query(`DELETE FROM watch_preferences WHERE user_id = $1`, [userId]);
  // The kept runs lose their links to the deleted setups and motors (ON DELETE SET NULL).
  return [...runs.flatMap((r) => [r.raw_key, r.data_key]), ...setups.map((s) => s.storage_key)];
}

/** TypeORM answers a DELETE … RETURNING on PostgreSQL with `[rows, count]`. */
function deleted<T>(result: unknown): T[] {
  return Array.isArray(result) && Array.isArray(result[0]) ? (result[0] as T[]) : (result as T[]);
}
