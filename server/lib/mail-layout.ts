import escapeHtml from 'escape-html';
import type { MailMessage } from './mailer';

const SIGNATURE = 'Tunewright, the tuning notebook of the Tidewater RC Club';

export type MailParts = {
  to: string;
  subject: string;
  heading: string;
  /** Plain paragraphs; any text in them is escaped, never read as markup. */
  paragraphs: string[];
  /** The one thing the mail asks the reader to do: a button in HTML, the bare address in text. */
  action?: { label: string; url: string };
  /** Small links under the signature, e.g. "Stop these mails" (escaped like the rest). */
  footerLinks?: Array<{ label: string; url: string }>;
};

/** Every mail Tunewright sends, in one layout: a text part and an HTML part with the same words. */
export function composeMail({ to, subject, heading, paragraphs, action, footerLinks = [] }: MailParts): MailMessage {
  const footerText = footerLinks.map((l) => `${l.label}: ${l.url}\n`).join('');
  const text = `${paragraphs.join('\n\n')}\n\n${action ? `${action.label}: ${action.url}\n\n` : ''}-- \n${SIGNATURE}\n${footerText}`;
  const button = action
    ? `<p><a href="${escapeHtml(action.url)}" style="background:#b5652b;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">${escapeHtml(action.label)}</a></p>` +
      `<p style="font-size:12px;color:#555">Or paste this link into your browser: ${escapeHtml(action.url)}</p>`
    : '';
  const html =
    `<div style="font-family:Inter,Arial,sans-serif;color:#1d2a44;max-width:560px">` +
    `<h1 style="font-size:20px">${escapeHtml(heading)}</h1>` +
    paragraphs.map((p) => `<p style="white-space:pre-wrap">${escapeHtml(p)}</p>`).join('') +
    button +
    `<p style="font-size:12px;color:#555">${escapeHtml(SIGNATURE)}</p>` +
    footerLinks.map((l) => `<p style="font-size:12px;color:#555"><a href="${escapeHtml(l.url)}">${escapeHtml(l.label)}</a></p>`).join('') +
    `</div>`;
  return { to, subject, text, html };
}
