import type { MailMessage } from '../../lib/mailer';
import { paths } from '../../../shared/paths';
import { composeMail } from '../../lib/mail-layout';

// Mail sent to an address nobody has proven yet (verification, "already registered", reset) carries no
// text a stranger chose: whoever typed the address at sign-up also chose the display name, so a greeting
// by name would let them put words (and links) of their own into someone else's inbox under our name.

export function verificationMail(to: string, url: string): MailMessage {
  return composeMail({
    to,
    subject: 'Confirm your e-mail for Tunewright',
    heading: 'Confirm your e-mail',
    paragraphs: [
      'Hello,',
      'Confirm your e-mail address to finish setting up your Tunewright account. The link works once and expires in 48 hours.',
      'If you did not sign up for Tunewright, ignore this mail: no account is made without this confirmation.',
    ],
    action: { label: 'Confirm e-mail', url },
  });
}

/** To the owner of an address someone tried to sign up with again (sign-up answers the same either way). */
export function alreadyRegisteredMail(to: string, appUrl: string): MailMessage {
  return composeMail({
    to,
    subject: 'You already have a Tunewright account',
    heading: 'You already have an account',
    paragraphs: [
      'Hello,',
      'Someone, probably you, asked to create a Tunewright account with this e-mail address. This address already has an account, so nothing was changed.',
      'If it was you, sign in, or choose a new password with the link below if you have forgotten it. If it was not you, ignore this mail.',
    ],
    action: { label: 'Choose a new password', url: `${appUrl}${paths.forgotPassword()}` },
  });
}

export function resetMail(to: string, url: string): MailMessage {
  return composeMail({
    to,
    subject: 'Reset your Tunewright password',
    heading: 'Reset your password',
    paragraphs: [
      'Hello,',
      'Someone asked to reset the password of your Tunewright account. If it was you, choose a new password with this link; it works once and expires in one hour. If it was not you, ignore this mail.',
    ],
    action: { label: 'Choose a new password', url },
  });
}

/** How a password change came about, in the words the notice uses. */
export type PasswordChangeRoute = 'account' | 'reset';

const WEEKDAYS = ['Sunday', 'Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday'];
const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];

/** "Tuesday 2 June 2026 at 18:05 UTC": one unambiguous form whatever the reader's time zone (built by hand, not by the ICU data of the day). */
export function formatChangeTime(at: Date): string {
  const hhmm = `${String(at.getUTCHours()).padStart(2, '0')}:${String(at.getUTCMinutes()).padStart(2, '0')}`;
  return `${WEEKDAYS[at.getUTCDay()]} ${at.getUTCDate()} ${MONTHS[at.getUTCMonth()]} ${at.getUTCFullYear()} at ${hhmm} UTC`;
}

/**
 * The notice sent to the account's address whenever its password changes (ASVS V6: tell the owner about
 * changes to how they sign in): what changed, when, how, and what to do if it was not them.
 */
export function passwordChangedMail(to: string, change: { at: Date; via: PasswordChangeRoute; appUrl: string }): MailMessage {
  const how =
    change.via === 'reset' ? 'with a password-reset link sent to this address' : 'from the account page, by someone signed in who knew the old password';
  const resetUrl = `${change.appUrl}${paths.forgotPassword()}`;
  return composeMail({
    to,
    subject: 'Your Tunewright password was changed',
    heading: 'Your password was changed',
    paragraphs: [
      'Hello,',
      `The password of your Tunewright account (${to}) was changed on ${formatChangeTime(change.at)}, ${how}. Every session of the account was signed out${change.via === 'account' ? ' except the one that made the change' : ''}.`,
      'If this was you, there is nothing more to do.',
      `If it was not you, someone else may have your password or be reading this mailbox. Reset your password now with the link below (it signs every session out again), make sure nobody else can open this mailbox, and tell a moderator of the Tidewater RC Club so they can check what was changed under your name.`,
    ],
    action: { label: 'It was not me: reset my password', url: resetUrl },
  });
}
