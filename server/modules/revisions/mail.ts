import type { DocumentKind } from '../../../shared/constants';
import { paths } from '../../../shared/paths';
import type { MailMessage } from '../../lib/mailer';
import { composeMail } from '../../lib/mail-layout';

function compose(to: string, subject: string, heading: string, paragraphs: string[], action: { label: string; url: string }): MailMessage {
  return composeMail({ to, subject, heading, paragraphs, action });
}

const noun = (kind: DocumentKind) => (kind === 'guide' ? 'guide' : 'parameter entry');

type About = { appUrl: string; kind: DocumentKind; slug: string; title: string; number: number; revisionId: string };

/** To each moderator when a revision starts waiting for review. */
export function reviewRequestMail(to: { email: string; displayName: string }, a: About & { authorName: string; note: string; isNew: boolean }): MailMessage {
  const what = a.isNew ? `a new ${noun(a.kind)}` : `an edit to the ${noun(a.kind)}`;
  return compose(
    to.email,
    `Waiting for review: ${a.title} (version ${a.number})`,
    'A revision is waiting for review',
    [`Hello ${to.displayName},`, `${a.authorName} has sent ${what} "${a.title}" (version ${a.number}) for review.`, `Their note: ${a.note}`],
    { label: 'Open it in the review queue', url: `${a.appUrl}${paths.review(a.revisionId)}` },
  );
}

/** To the author when their revision goes live. */
export function publishedMail(to: { email: string; displayName: string }, a: About & { reviewerName: string }): MailMessage {
  return compose(
    to.email,
    `Now live: ${a.title} (version ${a.number})`,
    'Your revision is live',
    [
      `Hello ${to.displayName},`,
      `${a.reviewerName} reviewed your version ${a.number} of "${a.title}" and published it. Readers now see it. Thank you for the work.`,
    ],
    { label: 'Read it', url: `${a.appUrl}${paths.documentVersion(a.kind, a.slug, a.number)}` },
  );
}

/** To the author when a moderator sends their revision back. */
export function returnedMail(to: { email: string; displayName: string }, a: About & { reviewerName: string; reason: string; isNew: boolean }): MailMessage {
  return compose(
    to.email,
    `Sent back for changes: ${a.title} (version ${a.number})`,
    'Your revision was sent back',
    [
      `Hello ${to.displayName},`,
      `${a.reviewerName} reviewed your version ${a.number} of "${a.title}" and sent it back with this reason:`,
      a.reason,
      'Your text is kept as it is: change it and send it for review again whenever you are ready.',
    ],
    { label: 'Open your revision', url: `${a.appUrl}${paths.editor(a.kind, a.slug, a.revisionId, a.isNew)}` },
  );
}

/** To the author of an older version when a moderator restores it: it is live again, still credited to them. */
export function restoredMail(
  to: { email: string; displayName: string },
  a: About & { restoredFromNumber: number; restorerName: string; reason: string },
): MailMessage {
  return compose(
    to.email,
    `Your version is live again: ${a.title}`,
    'Your earlier version was restored',
    [
      `Hello ${to.displayName},`,
      `${a.restorerName} restored your version ${a.restoredFromNumber} of "${a.title}". It is live again as version ${a.number}, credited to you.`,
      `Their reason: ${a.reason}`,
    ],
    { label: 'Read it', url: `${a.appUrl}${paths.documentVersion(a.kind, a.slug, a.number)}` },
  );
}
