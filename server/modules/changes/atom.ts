import escapeHtml from 'escape-html';
import { Feed } from 'feed';
import { documentPath, paths } from '../../../shared/paths';
import { CHANGE_ACTION_LABELS, type Change } from '../../../shared/schemas/change';

/** Where an entry points: the side-by-side diff of a guide's new version, else the page itself. */
export function changeLink(appUrl: string, c: Change): string {
  if (c.kind === 'guide' && c.action !== 'hidden' && c.number && c.number > 1)
    return `${appUrl}${paths.documentCompare(c.kind, c.slug, c.number - 1, c.number)}`;
  if (c.kind === 'guide' && c.number && c.action !== 'hidden') return `${appUrl}${paths.documentVersion(c.kind, c.slug, c.number)}`;
  return `${appUrl}${documentPath(c.kind, c.slug)}`;
}

/**
 * The recent changes as an Atom 1.0 feed (RFC 4287), written by the `feed` package (which escapes
 * every text). Each entry's id is a tag URI (RFC 4151) naming the document, version and action, so it
 * never changes once issued; the feed's own updated time is its newest entry's.
 */
export function changesAtom(appUrl: string, changes: Change[], selfUrl: string): string {
  const host = new URL(appUrl).hostname;
  const feed = new Feed({
    id: `${appUrl}/changes`,
    title: 'Tunewright: recent changes',
    description: 'New live versions, restores and hides of guides and parameter entries.',
    link: `${appUrl}/changes`,
    updated: changes[0] ? new Date(changes[0].at) : new Date(0),
    feedLinks: { atom: selfUrl },
    author: { name: 'Tunewright, the tuning notebook of the Tidewater RC Club', link: appUrl },
    copyright: 'Tidewater RC Club members',
    generator: false,
  });
  // The package marks titles and summaries type="html", so readers decode them as HTML: member text is
  // escaped first and arrives as the characters typed, never as markup.
  for (const c of changes) {
    const what =
      c.action === 'restored'
        ? `${CHANGE_ACTION_LABELS.restored} as version ${c.number} (text of version ${c.restoredFromNumber})`
        : c.action === 'hidden'
          ? 'Hidden'
          : `Version ${c.number}`;
    feed.addItem({
      title: escapeHtml(`${c.title}: ${what}`),
      id: `tag:${host},2026:${c.kind}/${c.slug}/${c.action}/${c.number ?? 0}/${Date.parse(c.at)}`,
      link: changeLink(appUrl, c),
      date: new Date(c.at),
      description: escapeHtml(c.note || CHANGE_ACTION_LABELS[c.action]),
      author: [{ name: c.author?.displayName ?? 'Tunewright' }],
    });
  }
  return feed.atom1();
}
