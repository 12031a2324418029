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

export function passwordChangedMail(to: string, displayName: string): MailMessage {
  const lines = [`Hello ${displayName},`, 'The password of your Tunewright account was just changed and your other sessions were signed out. If this was not you, reset your password now.'];
  return { to, subject: 'Your Tunewright password was changed', text: lines.join('\n\n'), html: layout('Password changed', lines) };
}
