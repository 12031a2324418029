import nodemailer from 'nodemailer';
import type { DataSource, EntityManager } from 'typeorm';
import { OutboxMessageEntity } from '../modules/mail/outbox-message.entity';
import type { Logger } from './logger';

export type MailMessage = { to: string; subject: string; text: string; html?: string; headers?: Record<string, string> };

export interface Mailer {
  /** Queues a mail in the outbox (inside the caller's transaction when a manager is given) and tries to send it soon. */
  send(message: MailMessage, manager?: EntityManager): Promise<void>;
  /** Delivers every due outbox row; returns how many were sent. */
  deliverPending(): Promise<number>;
  start(): void;
  stop(): Promise<void>;
}

const MAX_BACKOFF_MS = 5 * 60_000;

/**
 * The one mailer: every mail goes through the outbox table, so a mail that cannot be sent
 * now is kept and retried with back-off, and never fails the user's action.
 */
export function createMailer(opts: { dataSource: DataSource; smtpUrl: string; from: string; logger: Logger; intervalMs: number }): Mailer {
  const transport = nodemailer.createTransport(opts.smtpUrl, { from: opts.from });
  let timer: NodeJS.Timeout | null = null;
  let running: Promise<number> | null = null;
  let again = false;

  async function deliverOnce(): Promise<number> {
    let sent = 0;
    for (;;) {
      const batch = await opts.dataSource.transaction(async (m) => {
        const rows: OutboxMessageEntity[] = await m
          .getRepository(OutboxMessageEntity)
          .createQueryBuilder('o')
          .where('o.sentAt IS NULL AND o.nextAttemptAt <= now()')
          .orderBy('o.createdAt', 'ASC')
          .limit(20)
          .setLock('pessimistic_write')
          .setOnLocked('skip_locked')
          .getMany();
        for (const row of rows) {
          row.attempts += 1;
          try {
            await transport.sendMail({
              from: opts.from,
              to: row.to,
              subject: row.subject,
              text: row.text,
              html: row.html ?? undefined,
              headers: row.headers ?? undefined,
            });
            row.sentAt = new Date();
            row.lastError = null;
            sent++;
          } catch (err) {
            row.lastError = String((err as Error).message ?? err).slice(0, 500);
            row.nextAttemptAt = new Date(Date.now() + Math.min(MAX_BACKOFF_MS, 1000 * 2 ** Math.min(row.attempts, 12)));
            opts.logger.warn({ to: row.to, attempts: row.attempts, err: row.lastError }, 'mail delivery failed; will retry');
          }
          await m.getRepository(OutboxMessageEntity).save(row);
        }
        return rows.length;
      });
      if (batch < 20) return sent;
    }
  }

  async function deliverPending(): Promise<number> {
    if (running) {
      again = true;
      return running;
    }
    running = (async () => {
      let total = 0;
      do {
        again = false;
        total += await deliverOnce();
      } while (again);
      return total;
    })().finally(() => {
      running = null;
    });
    return running;
  }

  function kick() {
    deliverPending().catch((err) => opts.logger.warn({ err: String(err) }, 'outbox delivery pass failed'));
  }

  return {
    async send(message, manager) {
      const repo = (manager ?? opts.dataSource.manager).getRepository(OutboxMessageEntity);
      await repo.insert({
        to: message.to,
        subject: message.subject,
        text: message.text,
        html: message.html ?? null,
        headers: message.headers ?? null,
        nextAttemptAt: new Date(),
      });
      if (manager?.queryRunner?.isTransactionActive) {
        // Deliver after the caller's transaction commits; the periodic pass catches it otherwise.
        setTimeout(kick, 50);
      } else {
        kick();
      }
    },
    deliverPending,
    start() {
      if (timer) return;
      timer = setInterval(kick, opts.intervalMs);
      timer.unref();
    },
    async stop() {
      if (timer) clearInterval(timer);
      timer = null;
      if (running) await running.catch(() => 0);
      transport.close();
    },
  };
}
