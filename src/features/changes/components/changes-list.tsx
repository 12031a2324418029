import { Link } from 'react-router-dom';
import { CLASSES } from '@shared/constants';
import { CHANGE_ACTION_LABELS, type Change } from '@shared/schemas/change';
import { Chip } from '@/components/ui/card';

const className = (slug: string | null) => CLASSES.find((c) => c.slug === slug)?.name ?? null;
const pagePath = (c: Change) => (c.kind === 'guide' ? `/guides/${c.slug}` : `/parameters/${c.slug}`);
const when = (iso: string) => new Date(iso).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' });

/** What to open for a change: a guide's new version side by side with the one before, else the page. */
function target(c: Change) {
  if (c.kind === 'guide' && c.action !== 'hidden' && c.number && c.number > 1)
    return { to: `${pagePath(c)}/compare?from=${c.number - 1}&to=${c.number}`, label: 'What changed' };
  return { to: c.kind === 'guide' && c.number && c.action !== 'hidden' ? `${pagePath(c)}/v/${c.number}` : pagePath(c), label: 'Open' };
}

/** The list of recent changes; pressing an author's name filters by them. */
export function ChangesList({ changes, onAuthor }: { changes: Change[]; onAuthor: (author: { id: string; displayName: string }) => void }) {
  if (!changes.length) return <p className="rounded-md border border-paper-line p-6 text-center text-ink-soft">No changes match these filters.</p>;
  return (
    <ol className="divide-y divide-paper-line rounded-md border border-paper-line bg-white" aria-label="Recent changes, newest first">
      {changes.map((c) => {
        const t = target(c);
        return (
          <li key={`${c.kind}/${c.slug}/${c.action}/${c.number}/${c.at}`} className="flex flex-col gap-1 p-3 sm:flex-row sm:items-start sm:gap-4">
            <time dateTime={c.at} className="shrink-0 text-sm text-ink-soft tabular-nums sm:w-40">
              {when(c.at)}
            </time>
            <div className="min-w-0 flex-1">
              <div className="flex flex-wrap items-center gap-2">
                <Chip tone={c.action === 'hidden' ? 'ink' : c.action === 'restored' ? 'plain' : 'copper'}>{CHANGE_ACTION_LABELS[c.action]}</Chip>
                <Link to={pagePath(c)} className="font-medium break-words">
                  {c.title}
                </Link>
                <span className="text-sm text-ink-soft">
                  {c.kind === 'guide' ? 'Guide' : 'Parameter'}
                  {c.number && c.action !== 'hidden' ? ` · version ${c.number}` : ''}
                  {c.restoredFromNumber ? ` (text of version ${c.restoredFromNumber})` : ''}
                </span>
              </div>
              {c.note && <p className="mt-1 text-sm break-words">{c.note}</p>}
              <p className="mt-1 flex flex-wrap gap-x-3 text-sm text-ink-soft">
                {c.author && (
                  <span>
                    by{' '}
                    <button
                      type="button"
                      className="underline decoration-dotted hover:text-ink"
                      onClick={() => onAuthor(c.author!)}
                      title="Show only this author’s changes"
                    >
                      {c.author.displayName}
                    </button>
                  </span>
                )}
                {className(c.class) && <span>{className(c.class)}</span>}
                <Link to={t.to}>{t.label}</Link>
              </p>
            </div>
          </li>
        );
      })}
    </ol>
  );
}
