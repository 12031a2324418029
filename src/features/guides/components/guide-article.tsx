import { useMemo, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { REVISION_STATE_LABELS } from '@shared/constants';
import { RenderedMarkdown } from '@/lib/rendered-html';
import { Notice } from '@/components/ui/notice';
import type { ReadableGuideRevision } from '../api/guides';
import { formatDate } from '../lib/format';
import { withHeadingAnchors, type TocEntry } from '../lib/toc';
import { GuideMeta } from './guide-meta';

type Props = {
  revision: ReadableGuideRevision;
  /** The live revision's number, to tell readers of a permalink whether they are on the live version. */
  liveNumber?: number | null;
  renderWorkedExample?: (body: string, index: number) => ReactNode;
  parameterNames?: Record<string, string>;
  actions?: ReactNode;
  /** The id of the baseline card below the article, when the page shows one ("Jump to baseline"). */
  baselineAnchor?: string;
};

/** "On this page": jump links to the body's headings, and to the baseline card. */
function TableOfContents({ entries, baselineAnchor }: { entries: TocEntry[]; baselineAnchor?: string }) {
  if (entries.length < 2 && !baselineAnchor) return null;
  return (
    <nav aria-labelledby="toc-title" className="no-print rounded-lg border border-paper-line bg-paper-card px-4 py-3 text-sm" data-testid="guide-toc">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="toc-title" className="text-xs font-semibold tracking-wider text-ink-muted uppercase">
          On this page
        </h2>
        {baselineAnchor && (
          <Link to={{ hash: baselineAnchor }} className="font-medium">
            Jump to baseline
          </Link>
        )}
      </div>
      <ol className="mt-2 flex flex-col gap-1">
        {entries.map((e) => (
          <li key={e.id} className={e.level === 3 ? 'pl-4' : undefined}>
            <Link to={{ hash: e.id }} className="inline-block py-0.5">
              {e.text}
            </Link>
          </li>
        ))}
      </ol>
    </nav>
  );
}

/** A guide revision as readers see it: title, summary, chips, the version line and the body. */
export function GuideArticle({ revision, liveNumber, renderWorkedExample, parameterNames, actions, baselineAnchor }: Props) {
  const c = revision.content;
  const body = useMemo(() => withHeadingAnchors(revision.bodyHtml), [revision.bodyHtml]);
  const isLive = revision.state === 'published';
  const date = formatDate(revision.publishedAt ?? revision.submittedAt ?? revision.createdAt);
  return (
    <article className="flex flex-col gap-6" aria-labelledby="guide-title">
      <header className="flex flex-col gap-4 border-b border-paper-line pb-5">
        <p className="text-xs font-semibold tracking-[0.14em] text-copper uppercase">Tuning guide</p>
        <h1 id="guide-title" className="font-serif text-3xl leading-tight font-bold sm:text-4xl">
          {c.title}
        </h1>
        <p className="max-w-3xl font-serif text-lg leading-8 text-ink-soft">{c.summary}</p>
        <GuideMeta content={c} parameterNames={parameterNames} />
        <div className="flex flex-wrap items-center justify-between gap-3">
          <p className="text-sm text-ink-soft" data-testid="version-line">
            {isLive && revision.restoredFromNumber != null ? (
              // A restore copies older text: it stays credited to whoever wrote it, and says which moderator brought it back.
              <>
                Version {revision.number}, published on {date} by <span className="font-medium text-ink">{revision.author.displayName}</span> · restores version{' '}
                {revision.restoredFromNumber}
                {revision.reviewedBy && <>, brought back by {revision.reviewedBy.displayName}</>}
              </>
            ) : isLive ? (
              <>
                Version {revision.number}, published on {date} by <span className="font-medium text-ink">{revision.author.displayName}</span>
                {revision.reviewedBy && <> · reviewed by {revision.reviewedBy.displayName}</>}
              </>
            ) : (
              <>
                Version {revision.number} ({REVISION_STATE_LABELS[revision.state]}), {date} by{' '}
                <span className="font-medium text-ink">{revision.author.displayName}</span>
              </>
            )}
          </p>
          {actions && <div className="flex flex-wrap gap-2">{actions}</div>}
        </div>
        {!isLive && liveNumber != null && (
          <Notice tone="caution" title={`You are reading version ${revision.number}, not the live guide`}>
            It was {REVISION_STATE_LABELS[revision.state].toLowerCase()} when this page was built.{' '}
            <Link to={`/guides/${revision.slug}`}>Read the live version {liveNumber}</Link> or{' '}
            <Link to={`/guides/${revision.slug}/compare?from=${revision.number}&to=${liveNumber}`}>see what changed since</Link>.
          </Notice>
        )}
      </header>
      <TableOfContents entries={body.entries} baselineAnchor={baselineAnchor} />
      <RenderedMarkdown html={body.html} renderWorkedExample={renderWorkedExample} />
    </article>
  );
}
