import type { MailMessage } from '../../lib/mailer';
import { composeMail } from '../../lib/mail-layout';
import type { WatchedChange } from './watch.entity';

const noun = (kind: WatchedChange['kind']) => (kind === 'guide' ? 'guide' : 'parameter entry');

/** Where a mail's unsubscribe link goes: the page (one click, no sign-in) and the RFC 8058 one-click address. */
export type Unsubscribe = { pageUrl: string; oneClickUrl: string };

/** RFC 2369 / RFC 8058 headers: mail programs show their own "unsubscribe" that POSTs to our one-click address. */
export function listHeaders(u: Unsubscribe): Record<string, string> {
  return { 'List-Unsubscribe': `<${u.oneClickUrl}>`, 'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click' };
}

function describe(c: WatchedChange): string {
  const what = `the ${noun(c.kind)} "${c.title}"`;
  if (c.action === 'published') return `A new version (version ${c.number}) of ${what} is live, reviewed by ${c.actorName}.`;
  if (c.action === 'restored') return `${c.actorName} restored an earlier text of ${what} as version ${c.number}.`;
  return `A moderator took ${what} out of public view.`;
}

function noteLine(c: WatchedChange): string | null {
  if (c.action === 'hidden') return null;
  return c.note ? `Edit note: ${c.note}` : 'There is no edit note.';
}

/** One mail per change, to a watcher who wants them at once. */
export function changeMail(to: { email: string; displayName: string }, c: WatchedChange, u: Unsubscribe): MailMessage {
  const verb = c.action === 'published' ? 'New version' : c.action === 'restored' ? 'Restored' : 'Hidden';
  const mail = composeMail({
    to: to.email,
    subject: `${verb}: ${c.title}${c.number && c.action !== 'hidden' ? ` (version ${c.number})` : ''}`,
    heading: `A ${noun(c.kind)} you watch changed`,
    paragraphs: [`Hello ${to.displayName},`, describe(c), ...[noteLine(c)].filter((x): x is string => !!x), 'You get this mail because you watch it.'],
    action: c.diffUrl ? { label: 'See what changed', url: c.diffUrl } : { label: `Open the ${noun(c.kind)}`, url: c.pageUrl },
    footerLinks: [{ label: `Stop mails about "${c.title}"`, url: u.pageUrl }],
  });
  return { ...mail, headers: listHeaders(u) };
}

/** Everything that changed since the last digest, in one mail. */
export function digestMail(to: { email: string; displayName: string }, changes: WatchedChange[], u: Unsubscribe, settingsUrl: string): MailMessage {
  const lines = changes.map((c) => {
    const note = noteLine(c);
    return [describe(c), note, c.diffUrl ? `What changed: ${c.diffUrl}` : `Open it: ${c.pageUrl}`].filter(Boolean).join('\n');
  });
  const mail = composeMail({
    to: to.email,
    subject: `Today on Tunewright: ${changes.length} change${changes.length === 1 ? '' : 's'} to what you watch`,
    heading: 'What changed in what you watch',
    paragraphs: [`Hello ${to.displayName},`, ...lines, 'You get one mail a day because you chose the daily digest.'],
    action: { label: 'Choose how you get these mails', url: settingsUrl },
    footerLinks: [{ label: 'Stop all mails about what I watch', url: u.pageUrl }],
  });
  return { ...mail, headers: listHeaders(u) };
}

/** To the author of a guide or entry a moderator hid: the reason, and that its history is kept. */
export function hiddenNoticeMail(to: { email: string; displayName: string }, c: WatchedChange, reason: string): MailMessage {
  return composeMail({
    to: to.email,
    subject: `Taken out of public view: ${c.title}`,
    heading: `Your ${noun(c.kind)} was hidden`,
    paragraphs: [
      `Hello ${to.displayName},`,
      `A moderator took the ${noun(c.kind)} "${c.title}" out of public view, with this reason:`,
      reason,
      'Every version is kept, and a moderator can show it again. Reply to the moderators through the club if you think this was a mistake.',
    ],
    action: { label: `Open the ${noun(c.kind)}`, url: c.pageUrl },
  });
}
