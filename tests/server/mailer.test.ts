import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../setup/test-app';
import { startMailCatcher } from '../../server/lib/mail-catcher';
import { createMailer } from '../../server/lib/mailer';
import { OutboxMessageEntity } from '../../server/modules/mail/outbox-message.entity';
import { freePort } from '../../server/bin/postgres.mjs';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
});
afterAll(async () => {
  await t.close();
});

describe('mail outbox', () => {
  it('keeps a mail when SMTP is down and delivers it when the catcher comes back', async () => {
    const port = await freePort();
    const mailer = createMailer({
      dataSource: t.db.dataSource,
      smtpUrl: `smtp://127.0.0.1:${port}`,
      from: 'Tunewright <no-reply@tunewright.test>',
      logger: t.ctx.logger,
      intervalMs: 60_000,
    });
    await mailer.send({ to: 'waiting@tidewater.test', subject: 'Held in the outbox', text: 'hello' });
    await mailer.deliverPending();
    const repo = t.db.dataSource.getRepository(OutboxMessageEntity);
    const held = await repo.findOneByOrFail({ to: 'waiting@tidewater.test' });
    expect(held.sentAt).toBeNull();
    expect(held.attempts).toBeGreaterThanOrEqual(1);
    expect(held.lastError).toBeTruthy();

    const catcher = await startMailCatcher({ dataSource: t.db.dataSource, port });
    try {
      await repo.update({ id: held.id }, { nextAttemptAt: new Date() }); // skip the back-off wait
      expect(await mailer.deliverPending()).toBe(1);
      expect((await repo.findOneByOrFail({ id: held.id })).sentAt).not.toBeNull();
      const captured = await t.db.dataSource.query(`SELECT subject FROM captured_mail WHERE to_address = 'waiting@tidewater.test'`);
      expect(captured).toEqual([{ subject: 'Held in the outbox' }]);
    } finally {
      await mailer.stop();
      await catcher.close();
    }
  });

  it('GET /api/dev/mail lists captured mail newest first', async () => {
    await t.db.dataSource.query(
      `INSERT INTO captured_mail (to_address, from_address, subject, text_body, received_at) VALUES ('a@t.test','f@t.test','older', 'x', now() - interval '1 hour'), ('a@t.test','f@t.test','newer', 'y', now())`,
    );
    const res = await (await import('supertest')).default(t.app).get('/api/dev/mail?to=a@t.test');
    expect(res.status).toBe(200);
    expect(res.body.data.map((m: { subject: string }) => m.subject)).toEqual(['newer', 'older']);
    expect(res.body.data[0]).toHaveProperty('receivedAt');
  });
});
