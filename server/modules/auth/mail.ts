import type { MailMessage } from '../../lib/mailer';

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

function layout(title: string, paragraphs: string[], action?: { label: string; url: string }) {
  const body = paragraphs.map((p) => `<p>${esc(p)}</p>`).join('');
  const button = action
    ? `<p><a href="${esc(action.url)}" style="background:#b5652b;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">${esc(action.label)}</a></p><p style="font-size:12px;color:#555">Or paste this link into your browser: ${esc(action.url)}</p>`
    : '';
  return `<div style="font-family:Inter,Arial,sans-serif;color:#1d2a44;max-width:560px"><h1 style="font-size:20px">${esc(title)}</h1>${body}${button}<p style="font-size:12px;color:#555">Tunewright — the tuning notebook of the Tidewater RC Club</p></div>`;
}

export function verificationMail(to: string, displayName: string, url: string): MailMessage {
  const lines = [`Hello ${displayName},`, 'Confirm your e-mail address to finish setting up your Tunewright account. The link works once and expires in 48 hours.'];
  return { to, subject: 'Confirm your e-mail for Tunewright', text: `${lines.join('\n\n')}\n\n${url}\n`, html: layout('Confirm your e-mail', lines, { label: 'Confirm e-mail', url }) };
}

export function resetMail(to: string, displayName: string, url: string): MailMessage {
  const lines = [`Hello ${displayName},`, 'Someone asked to reset the password of your Tunewright account. If it was you, choose a new password with this link; it works once and expires in one hour. If it was not you, ignore this mail.'];
  return { to, subject: 'Reset your Tunewright password', text: `${lines.join('\n\n')}\n\n${url}\n`, html: layout('Reset your password', lines, { label: 'Choose a new password', url }) };
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
export function passwordChangedMail(to: string, displayName: string, change: { at: Date; via: PasswordChangeRoute; appUrl: string }): MailMessage {
  const how = change.via === 'reset' ? 'with a password-reset link sent to this address' : 'from the account page, by someone signed in who knew the old password';
  const resetUrl = `${change.appUrl}/forgot-password`;
  const lines = [
    `Hello ${displayName},`,
    `The password of your Tunewright account (${to}) was changed on ${formatChangeTime(change.at)}, ${how}. Every session of the account was signed out${change.via === 'account' ? ' except the one that made the change' : ''}.`,
    'If this was you, there is nothing more to do.',
    `If it was not you, someone else may have your password or be reading this mailbox. Reset your password now with the link below (it signs every session out again), make sure nobody else can open this mailbox, and tell a moderator of the Tidewater RC Club so they can check what was changed under your name.`,
  ];
  return {
    to,
    subject: 'Your Tunewright password was changed',
    text: `${lines.join('\n\n')}\n\nReset your password: ${resetUrl}\n`,
    html: layout('Your password was changed', lines, { label: 'It was not me: reset my password', url: resetUrl }),
  };
}
