import type { MailMessage } from '../../lib/mailer';
import { composeMail } from '../../lib/mail-layout';
import { formatChangeTime } from '../auth/mail';

/** To the address of an account that was just deleted: what went, what stayed, and what to do if it was not them. */
export function accountDeletedMail(to: string, opts: { at: Date; published: number }): MailMessage {
  return composeMail({
    to,
    subject: 'Your Tunewright account was deleted',
    heading: 'Your account was deleted',
    paragraphs: [
      'Hello,',
      `Your Tunewright account was deleted on ${formatChangeTime(opts.at)}, from its account page, with its password.`,
      'Your profile, drafts and proposals, uploaded setups, run logs, motors and bench checks, and your watch list are gone, and every signed-in session was ended.',
      opts.published
        ? `The ${opts.published === 1 ? 'version you published stays' : `${opts.published} versions you published stay`} in the library, credited to "Former member", as the history of a shared page needs.`
        : 'You had no published versions, so nothing of yours stays in the library.',
      'If you did not do this, reply to this mail at once: someone knew your password.',
    ],
  });
}
