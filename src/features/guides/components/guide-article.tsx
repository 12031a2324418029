import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { REVISION_STATE_LABELS } from '@shared/constants';
import { RenderedMarkdown } from '@/lib/rendered-html';
import { Notice } from '@/components/ui/notice';
import type { ReadableGuideRevision } from '../api/guides';
import { formatDate } from '../lib/format';
import { GuideMeta } from './guide-meta';

type Props = {
  revision: ReadableGuideRevision;
  /** The live revision's number, to tell readers of a permalink whether they are on the live version. */
  liveNumber?: number | null;
  renderWorkedExample?: (body: string, index: number) => ReactNode;
  parameterNames?: Record<string, string>;
  actions?: ReactNode;
};

/** A guide revision as readers see it: title, summary, chips, the version line and the body. */
export function GuideArticle({ revision, liveNumber, renderWorkedExample, parameterNames, actions }: Props) {
  const c = revision.content;
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
              // A restore is a moderator's copy of older text: naming them as its author (and reviewer) would misattribute it.
              <>
                Version {revision.number}, published on {date} · restores version {revision.restoredFromNumber}, brought back by{' '}
                <span className="font-medium text-ink">{revision.author.displayName}</span>
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
      <RenderedMarkdown html={revision.bodyHtml} renderWorkedExample={renderWorkedExample} />
    </article>
  );
}
