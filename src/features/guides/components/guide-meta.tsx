import { Link } from 'react-router-dom';
import type { GuideContent } from '@shared/schemas/guide';
import { Chip } from '@/components/ui/card';
import { guideQueries, taxonomyName } from '../api/guides';
import { useQuery } from '@tanstack/react-query';

/** Class, surface, conditions, tags and the parameters a guide discusses; each chip opens the guide list filtered by it. */
export function GuideMeta({ content, parameterNames }: { content: GuideContent; parameterNames?: Record<string, string> }) {
  const taxonomy = useQuery(guideQueries.taxonomy()).data;
  return (
    <div className="flex flex-col gap-3 text-sm">
      <dl className="flex flex-wrap items-center gap-2">
        <dt className="sr-only">Class</dt>
        <dd>
          <Link
            to={`/guides?class=${encodeURIComponent(content.class)}`}
            className="no-underline"
            aria-label={`Guides for ${taxonomyName(taxonomy?.classes, content.class)}`}
          >
            <Chip tone="ink">{taxonomyName(taxonomy?.classes, content.class)}</Chip>
          </Link>
        </dd>
        <dt className="sr-only">Surface</dt>
        <dd>
          <Link
            to={`/guides?surface=${encodeURIComponent(content.surface)}`}
            className="no-underline"
            aria-label={`Guides on ${taxonomyName(taxonomy?.surfaces, content.surface)}`}
          >
            <Chip tone="copper">{taxonomyName(taxonomy?.surfaces, content.surface)}</Chip>
          </Link>
        </dd>
        {content.conditions && (
          <>
            <dt className="sr-only">Conditions</dt>
            <dd className="text-ink-soft">{content.conditions}</dd>
          </>
        )}
      </dl>
      {content.tags.length > 0 && (
        <div className="flex flex-wrap items-center gap-1.5">
          <span className="text-xs font-semibold tracking-wider text-ink-muted uppercase">Tags</span>
          <ul className="flex flex-wrap gap-1.5" aria-label="Tags">
            {content.tags.map((t) => (
              <li key={t}>
                <Link to={`/guides?tag=${encodeURIComponent(t)}`} className="no-underline" aria-label={`Guides tagged ${t}`}>
                  <Chip>{t}</Chip>
                </Link>
              </li>
            ))}
          </ul>
        </div>
      )}
      {content.parameters.length > 0 && (
        <div className="flex flex-wrap items-baseline gap-x-2 gap-y-1">
          <span className="text-xs font-semibold tracking-wider text-ink-muted uppercase">Settings discussed</span>
          <ul className="flex flex-wrap gap-x-3 gap-y-1" aria-label="Settings discussed">
            {content.parameters.map((p) => (
              <li key={p}>
                <Link to={`/parameters/${p}`}>{parameterNames?.[p] ?? p.replace(/-/g, ' ')}</Link>
              </li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}
