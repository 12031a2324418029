import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import type { DataSource } from 'typeorm';
import { CapturedMailEntity } from '../modules/dev-mail/captured-mail.entity';

/** The List-* headers of a received mail, as sent (so tests can follow an unsubscribe link). */
function listHeaders(lines: ReadonlyArray<{ key: string; line: string }>): Record<string, string> | null {
  const kept = lines.filter((h) => h.key.startsWith('list-'));
  if (!kept.length) return null;
  return Object.fromEntries(
    kept.map((h) => [
      h.key,
      h.line
        .slice(h.line.indexOf(':') + 1)
        .replace(/\r?\n\s+/g, ' ')
        .trim(),
    ]),
  );
}

/**
 * A loopback SMTP server for local demo and tests: accepts every mail and keeps it in the
 * captured_mail table, where /dev/mail shows it.
 */
export async function startMailCatcher(opts: { dataSource: DataSource; port: number; host?: string }) {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    banner: 'Tunewright local mail catcher',
    onData(stream, session, callback) {
      simpleParser(stream)
        .then(async (mail) => {
          const to = session.envelope.rcptTo.map((r) => r.address).join(', ');
          await opts.dataSource.getRepository(CapturedMailEntity).insert({
            to,
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
            subject: mail.subject ?? '',
            text: mail.text ?? '',
            html: typeof mail.html === 'string' ? mail.html : null,
            headers: listHeaders(mail.headerLines),
            receivedAt: new Date(),
          });
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port, opts.host ?? '127.0.0.1', () => resolve());
  });
  const address = server.server.address();
  const port = typeof address === 'object' && address ? address.port : opts.port;
  return {
    port,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
