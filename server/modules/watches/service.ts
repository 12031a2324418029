import type { DocumentKind } from '../../../shared/constants';
import type { UnsubscribeResult, Watch, WatchDelivery, WatchState } from '../../../shared/schemas/watch';
import type { AppContext } from '../../context';
import { AppError, notFound } from '../../lib/errors';
import { UserEntity } from '../auth/user.entity';
import { DocumentEntity } from '../revisions/document.entity';
import { canSeeDocument, type Actor } from '../revisions/policy';
import { digestMail } from './mail';
import { unsubscribeLinks } from './links';
import { verifyUnsubscribe } from './tokens';
import { WatchDigestItemEntity, WatchEntity, WatchPreferenceEntity, type WatchedChange } from './watch.entity';

/** The hour (UTC) the daily digest goes out; a pass after it sends everything waiting since the last one. */
export const DIGEST_HOUR_UTC = 6;

const missing = (kind: DocumentKind) => notFound(kind === 'guide' ? 'That guide' : 'That parameter');

export function watchService(ctx: AppContext) {
  const ds = ctx.dataSource;

  async function visibleDocument(actor: Actor, kind: DocumentKind, slug: string) {
    const doc = await ds.getRepository(DocumentEntity).findOneBy({ kind, slug });
    // Only what has been live can be watched; drafts of a new guide and hidden ones are not there for members.
    if (!doc || !doc.publishedRevisionId || !canSeeDocument(actor, doc)) throw missing(kind);
    return doc;
  }

  return {
    async state(actor: NonNullable<Actor>, kind: DocumentKind, slug: string): Promise<WatchState> {
      const doc = await visibleDocument(actor, kind, slug);
      const row = await ds.getRepository(WatchEntity).findOneBy({ userId: actor.id, documentId: doc.id });
      return { kind, slug, watching: !!row?.watching };
    },

    /** Starts (or stops) watching; the same answer however often it is called. */
    async set(actor: NonNullable<Actor>, kind: DocumentKind, slug: string, watching: boolean): Promise<WatchState> {
      const doc = await visibleDocument(actor, kind, slug);
      await ds.query(
        `INSERT INTO watches (user_id, document_id, watching) VALUES ($1, $2, $3)
         ON CONFLICT (user_id, document_id) DO UPDATE SET watching = EXCLUDED.watching, updated_at = now()`,
        [actor.id, doc.id, watching],
      );
      return { kind, slug, watching };
    },

    /** What the person watches, with each document's live title, most recent first. */
    async list(actor: NonNullable<Actor>): Promise<Watch[]> {
      const rows: Array<{ kind: DocumentKind; slug: string; content: { title?: string; name?: string } | null; since: Date }> = await ds.query(
        `SELECT d.kind, d.slug, r.content, w.updated_at AS since
           FROM watches w
           JOIN documents d ON d.id = w.document_id
           LEFT JOIN revisions r ON r.id = d.published_revision_id
          WHERE w.user_id = $1 AND w.watching AND (d.hidden_at IS NULL OR $2)
          ORDER BY w.updated_at DESC, d.slug`,
        [actor.id, actor.role !== 'member'],
      );
      return rows.map((r) => ({
        kind: r.kind,
        slug: r.slug,
        title: String(r.content?.title ?? r.content?.name ?? r.slug),
        since: new Date(r.since).toISOString(),
      }));
    },

    async settings(actor: NonNullable<Actor>): Promise<{ delivery: WatchDelivery }> {
      const row = await ds.getRepository(WatchPreferenceEntity).findOneBy({ userId: actor.id });
      return { delivery: row?.delivery ?? 'immediate' };
    },

    async setSettings(actor: NonNullable<Actor>, delivery: WatchDelivery) {
      await ds.query(`INSERT INTO watch_preferences (user_id, delivery) VALUES ($1, $2) ON CONFLICT (user_id) DO UPDATE SET delivery = EXCLUDED.delivery`, [
        actor.id,
        delivery,
      ]);
      return { delivery };
    },

    /**
     * A signed link from a mail: stops mail about one document (its watch ends) or, from a digest, all
     * watch mail (delivery becomes off; the watch list stays). Needs no session; the signature is the proof.
     */
    async unsubscribe(token: string): Promise<UnsubscribeResult> {
      const payload = verifyUnsubscribe(ctx.config.sessionSecret, token);
      if (!payload)
        throw new AppError(
          400,
          'token_invalid',
          'That unsubscribe link is not valid. Open it from the mail again, or change your settings on your account page.',
        );
      const user = await ds.getRepository(UserEntity).findOneBy({ id: payload.u });
      if (!user) throw new AppError(400, 'token_invalid', 'That unsubscribe link is not valid any more: the account is gone.');
      if (!payload.d) {
        await this.setSettings({ id: user.id } as NonNullable<Actor>, 'off');
        return { scope: 'all', kind: null, slug: null, title: null };
      }
      const doc = await ds.getRepository(DocumentEntity).findOneBy({ id: payload.d });
      if (!doc) return { scope: 'document', kind: null, slug: null, title: null };
      await ds.query(`UPDATE watches SET watching = false, updated_at = now() WHERE user_id = $1 AND document_id = $2`, [user.id, doc.id]);
      const [live] = doc.publishedRevisionId ? await ds.query(`SELECT content FROM revisions WHERE id = $1`, [doc.publishedRevisionId]) : [];
      const title = live ? String(live.content?.title ?? live.content?.name ?? doc.slug) : doc.slug;
      return { scope: 'document', kind: doc.kind, slug: doc.slug, title };
    },

    /**
     * Sends each daily-digest reader everything waiting for them, once a day after DIGEST_HOUR_UTC:
     * one transaction per person (rows deleted and mail queued together). Returns how many digests went.
     */
    async sendDueDigests(now = new Date()): Promise<number> {
      const today = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate(), DIGEST_HOUR_UTC));
      const dueSince = now >= today ? today : new Date(today.getTime() - 86_400_000);
      const due: Array<{ user_id: string }> = await ds.query(
        `SELECT DISTINCT i.user_id FROM watch_digest_items i
           LEFT JOIN watch_preferences p ON p.user_id = i.user_id
          WHERE i.created_at <= $1 AND (p.last_digest_at IS NULL OR p.last_digest_at < $2)`,
        [now, dueSince],
      );
      let sent = 0;
      for (const { user_id: userId } of due) {
        const went = await ds.transaction(async (m) => {
          const pref = await m
            .getRepository(WatchPreferenceEntity)
            .createQueryBuilder('p')
            .where('p.userId = :userId', { userId })
            .setLock('pessimistic_write')
            .getOne();
          if (pref?.lastDigestAt && pref.lastDigestAt >= dueSince) return false;
          const items = await m.getRepository(WatchDigestItemEntity).find({ where: { userId }, order: { createdAt: 'ASC' } });
          const user = await m.getRepository(UserEntity).findOneBy({ id: userId });
          await m.getRepository(WatchDigestItemEntity).delete(items.map((i) => i.id));
          await m.query(
            `INSERT INTO watch_preferences (user_id, delivery, last_digest_at) VALUES ($1, 'daily', $2)
             ON CONFLICT (user_id) DO UPDATE SET last_digest_at = EXCLUDED.last_digest_at`,
            [userId, now],
          );
          if (!items.length || !user || user.disabledAt || (pref && pref.delivery === 'off')) return false;
          const changes: WatchedChange[] = items.map((i) => i.change);
          await ctx.mailer.send(digestMail(user, changes, unsubscribeLinks(ctx, userId), `${ctx.config.appUrl}/account#watching`), m);
          return true;
        });
        if (went) sent++;
      }
      return sent;
    },
  };
}

/** Runs the digest pass every 15 minutes (each instance; the row lock keeps a digest from going twice). */
export function startDigests(ctx: AppContext, intervalMs = 15 * 60_000) {
  const run = () =>
    void watchService(ctx)
      .sendDueDigests()
      .catch((err) => ctx.logger.warn({ err: String(err) }, 'digest pass failed'));
  const timer = setInterval(run, intervalMs);
  timer.unref();
  return () => clearInterval(timer);
}
