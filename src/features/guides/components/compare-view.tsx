import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { FieldChangesTable, WordDiffView } from '@/components/diff/word-diff-view';
import { Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { guideQueries } from '../api/guides';
import { formatDate } from '../lib/format';
import { StateBadge } from './revision-history';

/** What changed between two versions of a guide: details first, then the prose word by word. */
export function CompareView({ slug, from, to }: { slug: string; from: number; to: number }) {
  const cmp = useQuery(guideQueries.compare(slug, from, to));
  if (cmp.isPending) return <Spinner label="Comparing…" />;
  if (cmp.isError)
    return (
      <Notice tone="danger" title="These versions could not be compared">
        {cmp.error.message}
      </Notice>
    );
  const { from: a, to: b, bodyDiff, bodyDiffDetail, changedFields } = cmp.data;
  const fromLabel = `Version ${a.number}`;
  const toLabel = `Version ${b.number}`;
  return (
    <div className="flex flex-col gap-8">
      <div className="grid gap-3 sm:grid-cols-2">
        {[a, b].map((r) => (
          <div key={r.id} className="rounded-md border border-paper-line bg-paper-card p-3 text-sm">
            <p className="flex flex-wrap items-center gap-2 font-semibold">
              <Link to={`/guides/${slug}/v/${r.number}`}>Version {r.number}</Link> <StateBadge state={r.state} />
            </p>
            <p className="mt-1 text-ink-soft">
              {r.author.displayName} · {formatDate(r.publishedAt ?? r.submittedAt ?? r.createdAt)}
            </p>
            {r.note && <p className="mt-1 text-ink-soft italic">“{r.note}”</p>}
          </div>
        ))}
      </div>
      <section aria-labelledby="changed-details" className="flex flex-col gap-2">
        <h2 id="changed-details" className="text-lg font-semibold">
          Changed details
        </h2>
        <FieldChangesTable changes={changedFields} fromLabel={fromLabel} toLabel={toLabel} caption="Fields that differ" />
      </section>
      <section aria-labelledby="changed-text" className="flex flex-col gap-2">
        <h2 id="changed-text" className="text-lg font-semibold">
          Changed text
        </h2>
        <WordDiffView changes={bodyDiff} detail={bodyDiffDetail} fromLabel={fromLabel} toLabel={toLabel} />
      </section>
    </div>
  );
}
