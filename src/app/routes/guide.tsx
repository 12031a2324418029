import { lazy, Suspense, useEffect, useMemo, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link, useParams } from 'react-router-dom';
import { hasRole } from '@shared/constants';
import { Card, Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { WhenNear } from '@/components/ui/when-near';
import { ApiError } from '@/lib/api-client';
import { useCurrentUser } from '@/features/auth/api/auth';
import { guideQueries } from '@/features/guides/api/guides';
import { GuideArticle } from '@/features/guides/components/guide-article';
import { HideGuideButton, UnhideGuideButton } from '@/features/guides/components/hide-guide-button';
import { RevisionHistory } from '@/features/guides/components/revision-history';
import { WatchButton } from '@/features/watches/components/watch-button';
import { KeepForTrackButton } from '@/features/offline/components/keep-for-track';
import { renderWorkedExample } from '../worked-example';

function Missing({ error }: { error: Error }) {
  const notFound = error instanceof ApiError && error.status === 404;
  return (
    <Card className="mx-auto max-w-lg p-8 text-center">
      <h1 className="font-serif text-2xl font-bold">{notFound ? 'This guide is not available' : 'This guide could not be loaded'}</h1>
      <p className="mt-2 text-ink-soft">{notFound ? 'There is no guide at this address, or a moderator has taken it out of public view.' : error.message}</p>
      <Link to="/guides" className="mt-5 inline-block">
        Browse all guides
      </Link>
    </Card>
  );
}

/** The live guide (/guides/:slug) or one version of it (/guides/:slug/v/:n). */
export function GuidePage() {
  const { slug = '', n } = useParams();
  const number = n ? Number(n) : null;
  const me = useCurrentUser().data;
  const detail = useQuery(guideQueries.detail(slug));
  const version = useQuery({ ...guideQueries.revision(slug, number ?? 0), enabled: number != null && Number.isInteger(number) });
  const params = useQuery(guideQueries.parameterOptions());
  const parameterNames = useMemo(() => Object.fromEntries((params.data ?? []).map((p) => [p.slug, p.name])), [params.data]);
  const canModerate = hasRole(me, 'moderator');
  // Hiding or showing swaps one control for another: the new one takes the focus.
  const [swapped, setSwapped] = useState<'hidden' | 'shown' | null>(null);

  if (number != null && !Number.isInteger(number)) return <Missing error={new ApiError(404, 'not_found', 'No such version')} />;
  const shown = number != null ? version : detail;
  if (shown.isPending) return <Spinner label="Loading the guide…" />;
  if (shown.isError) return <Missing error={shown.error} />;
  const revision = number != null ? version.data! : detail.data!.revision;
  const liveNumber = detail.data?.revision.number ?? null;
  const hidden = detail.data?.guide.hidden;

  const actions = (
    <>
      {me && (
        <Link
          to={`/guides/${slug}/edit`}
          className="rounded-md border border-copper-dark bg-copper px-3 py-1.5 text-sm font-medium text-white no-underline hover:bg-copper-dark"
        >
          Propose an edit
        </Link>
      )}
      {me && liveNumber != null && <WatchButton kind="guide" slug={slug} />}
      {revision.number === liveNumber && <KeepForTrackButton slug={slug} parameters={revision.content.parameters ?? []} signedIn={!!me} />}
      {canModerate && !hidden && <HideGuideButton slug={slug} onHidden={() => setSwapped('hidden')} focusOnMount={swapped === 'shown'} />}
    </>
  );

  return (
    <div className="grid gap-10 lg:grid-cols-[minmax(0,1fr)_16rem]">
      <div className="min-w-0 max-w-3xl">
        {hidden && (
          <Notice tone="danger" title="Hidden from readers" className="mb-4">
            <p>{detail.data?.guide.hiddenReason}</p>
            {canModerate && <UnhideGuideButton slug={slug} onShown={() => setSwapped('shown')} focusOnMount={swapped === 'hidden'} />}
          </Notice>
        )}
        <GuideArticle
          revision={revision}
          liveNumber={number != null ? liveNumber : null}
          renderWorkedExample={renderWorkedExample}
          parameterNames={parameterNames}
          actions={actions}
          baselineAnchor={revision.number === liveNumber && revision.setup ? 'setup' : undefined}
        />
        {revision.number === liveNumber ? (
          <section id="setup" className="mt-10 scroll-mt-4" aria-label="Baseline setup">
            <LazySetupSheet slug={slug} names={parameterNames} />
          </section>
        ) : (
          revision.setup && (
            <Notice tone="info" className="mt-10" title="This older version had its own baseline setup">
              Downloads and the comparison use the live version’s baseline. Open the <Link to={`/guides/${slug}`}>live version</Link> to download it.
            </Notice>
          )
        )}
        {revision.number === liveNumber && <LazyGuideEvidence slug={slug} />}
        <section id="history" aria-labelledby="history-title" className="mt-14 border-t border-paper-line pt-6">
          <h2 id="history-title" className="mb-3 text-xl font-semibold">
            History
          </h2>
          <p className="mb-4 text-sm text-ink-soft">Every version is kept. Open any of them, or compare two to see what changed word by word.</p>
          <RevisionHistory slug={slug} canModerate={canModerate} currentNumber={revision.number} />
        </section>
      </div>
      <aside className="no-print hidden lg:block" aria-label="About this guide">
        <Card className="sticky top-4 flex flex-col gap-2 p-4 text-sm">
          <p className="font-semibold">Version {revision.number}</p>
          <p className="text-ink-soft">Every edit is reviewed by a moderator before it goes live.</p>
          <a href="#history">See the history</a>
          {liveNumber != null && liveNumber > 1 && (
            <Link to={`/guides/${slug}/compare?from=${liveNumber - 1}&to=${liveNumber}`}>What changed in the last edit</Link>
          )}
        </Card>
      </aside>
    </div>
  );
}

// The baseline setup sits below the guide's body: its code (the record table, computed values, cautions) is
// its own chunk, fetched once the page is up, so the guide paints without it. It loads at once, not when
// scrolled near: a guide opened once must have its baseline stored for reading offline.
const SetupSheet = lazy(() => import('@/features/setups/components/setup-sheet').then((m) => ({ default: m.SetupSheet })));
function LazySetupSheet(props: { slug: string; names: Record<string, string> }) {
  const [mounted, setMounted] = useState(false);
  useEffect(() => setMounted(true), []);
  if (!mounted) return <Spinner label="Loading the baseline setup…" />;
  return (
    <Suspense fallback={<Spinner label="Loading the baseline setup…" />}>
      <SetupSheet {...props} />
    </Suspense>
  );
}

// The evidence card (uPlot and its stylesheet) loads only in the browser, after the page is up: the server's
// page drawing imports this module and must never load chart code or CSS. It sits below the guide's body, so
// its code is fetched only when the reader scrolls near it, not with the page.
const GuideEvidence = lazy(() => import('@/features/runs/components/evidence').then((m) => ({ default: m.GuideEvidence })));
function LazyGuideEvidence({ slug }: { slug: string }) {
  const [mounted, setMounted] = useState(false);
  useEffect(() => setMounted(true), []);
  if (!mounted) return null;
  return (
    <WhenNear placeholder={null}>
      <Suspense fallback={null}>
        <GuideEvidence slug={slug} />
      </Suspense>
    </WhenNear>
  );
}
