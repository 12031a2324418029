import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { Card, Chip, Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { guideQueries, taxonomyName, type GuideFilters } from '../api/guides';
import { formatDate } from '../lib/format';

/** Published guides matching the filters, newest knowledge first as the server orders them. */
export function GuideList({ filters }: { filters: GuideFilters }) {
  const list = useQuery(guideQueries.list(filters));
  const taxonomy = useQuery(guideQueries.taxonomy()).data;
  if (list.isPending) return <Spinner label="Loading guides…" />;
  if (list.isError)
    return (
      <Notice tone="danger" title="The guides could not be loaded">
        {list.error.message}
      </Notice>
    );
  const guides = list.data;
  if (guides.length === 0)
    return (
      <Notice title="No guide matches these filters yet">
        Try another class or surface, or clear the filters. Know this combination well? Sign in and write the first guide for it.
      </Notice>
    );
  return (
    <div className="flex flex-col gap-3">
      <p className="text-sm text-ink-muted" aria-live="polite">
        {guides.length} {guides.length === 1 ? 'guide' : 'guides'}
      </p>
      <ul className="grid gap-3 md:grid-cols-2">
        {guides.map((g) => (
          <li key={g.slug}>
            <Card className="flex h-full flex-col gap-2 p-4">
              <h2 className="font-serif text-lg leading-snug font-bold">
                <Link to={`/guides/${g.slug}`} className="text-ink no-underline hover:underline">
                  {g.title}
                </Link>
              </h2>
              <p className="line-clamp-3 text-sm text-ink-soft">{g.summary}</p>
              <div className="mt-auto flex flex-wrap items-center gap-2 pt-1 text-xs text-ink-muted">
                <Chip tone="ink">{taxonomyName(taxonomy?.classes, g.class)}</Chip>
                <Chip tone="copper">{taxonomyName(taxonomy?.surfaces, g.surface)}</Chip>
                <span>
                  Version {g.version}
                  {g.publishedAt ? ` · ${formatDate(g.publishedAt)}` : ''}
                  {g.author ? ` · ${g.author.displayName}` : ''}
                </span>
              </div>
            </Card>
          </li>
        ))}
      </ul>
    </div>
  );
}
