import { type ReactNode } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import type { CalcWarning } from '@shared/calc/types';
import { BodyDiff, MetadataChanges, setupValueText } from './review-diffs';
import { Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { Markdown } from '@/lib/markdown';
import { reviewQueries, type ReviewDetail as Detail, type SetupChange } from '../api/reviews';
import { ContentChecks } from '@/components/ui/content-checks';
import { ImageChanges } from './image-changes';
import { WordDiffView } from '@/components/diff/word-diff-view';
import { Decision, when } from './review-decision';

function WarningList({ warnings }: { warnings: CalcWarning[] }) {
  return (
    <ul className="flex flex-col gap-2">
      {warnings.map((w, i) => (
        <li key={`${w.code}-${i}`}>
          <Notice tone={w.level === 'danger' ? 'danger' : w.level === 'caution' ? 'caution' : 'info'} title={w.field ? `${w.field}` : undefined}>
            {w.message}
          </Notice>
        </li>
      ))}
    </ul>
  );
}

function SetupChangesTable({ changes }: { changes: SetupChange[] }) {
  if (changes.length === 0) return <p className="text-sm text-ink-soft">The attached setup record is unchanged.</p>;
  return (
    <div className="table-scroll">
      <table className="w-full border-collapse text-sm">
        <caption className="sr-only">Changed setup-record fields</caption>
        <thead>
          <tr className="border-b-2 border-ink/30 bg-paper-deep text-left">
            <th scope="col" className="px-3 py-2 font-semibold">
              Field
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Live
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Proposed
            </th>
          </tr>
        </thead>
        <tbody>
          {changes.map((c) => (
            <tr key={c.path} className="border-b border-paper-line">
              <th scope="row" className="px-3 py-2 text-left font-medium">
                {c.label ?? c.path}
              </th>
              <td className="px-3 py-2 text-danger tabular-nums">{setupValueText(c, c.from)}</td>
              <td className="px-3 py-2 text-ok tabular-nums">{setupValueText(c, c.to)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function Section({ id, title, children }: { id: string; title: string; children: ReactNode }) {
  return (
    <section aria-labelledby={id} className="flex flex-col gap-3">
      <h2 id={id} className="text-lg font-semibold">
        {title}
      </h2>
      {children}
    </section>
  );
}

/** What a publish puts in front of readers, said before the moderator confirms it. */

/** A proposal sent back before and submitted again: the reason it went back and what the author changed since, in one place. */
function SinceReturn({ since }: { since: NonNullable<Detail['sinceReturn']> }) {
  return (
    <section aria-labelledby="since-return" className="flex flex-col gap-3 rounded-lg border border-caution-line bg-caution-wash/50 p-4">
      <h2 id="since-return" className="text-lg font-semibold">
        {since.changed ? 'Changed since it was sent back' : 'Unchanged since it was sent back'}
      </h2>
      <p className="text-sm">
        Sent back {when.format(new Date(since.returnedAt))} with this reason: <q className="italic">{since.reason}</q>
      </p>
      {!since.changed && (
        <p className="text-sm text-ink-soft">
          The author submitted it again without changing the text, the details or the baseline; the edit note may say why.
        </p>
      )}
      {since.changedFields.length > 0 && <MetadataChanges changes={since.changedFields} />}
      {since.bodyDiff.length > 0 && <WordDiffView changes={since.bodyDiff} fromLabel="As sent back" toLabel="Now" />}
      {since.setupChanged && <p className="text-sm">The baseline setup record changed too; its fields are compared with the live version below.</p>}
    </section>
  );
}

/** The review page: what the proposal changes against the live revision, and the decision. */
export function ReviewDetailView({
  revisionId,
  currentUserId,
  renderWorkedExample,
}: {
  revisionId: string;
  currentUserId: string;
  renderWorkedExample?: (body: string, index: number) => ReactNode;
}) {
  const q = useQuery(reviewQueries.detail(revisionId));
  if (q.isPending) return <Spinner label="Loading the proposal…" />;
  if (q.isError)
    return (
      <Notice tone="danger" title="This proposal could not be loaded">
        {q.error.message}
      </Notice>
    );
  const d = q.data;
  const { revision, live } = d;
  const title = String(revision.content.title ?? revision.content.name ?? 'Untitled');
  const liveLabel = live ? `Live version ${live.number}` : 'Nothing live yet';
  const proposedLabel = `Proposed version ${revision.number}`;
  const examples = d.workedExamples ?? [];
  const warningCount = examples.reduce((n, w) => n + w.warnings.length + w.issues.length, 0) + (d.setupWarnings?.length ?? 0);
  const href = revision.kind === 'guide' ? `/guides/${revision.slug}` : `/parameters/${revision.slug}`;
  return (
    <div className="flex flex-col gap-8">
      <header className="flex flex-col gap-2 border-b border-paper-line pb-4">
        <p className="text-xs font-semibold tracking-[0.14em] text-copper uppercase">Review · {revision.kind === 'guide' ? 'guide' : 'setting'}</p>
        <h1 className="font-serif text-3xl font-bold">{title}</h1>
        <p className="text-sm text-ink-soft">
          {proposedLabel} by <span className="font-medium text-ink">{revision.author.displayName}</span>
          {revision.submittedAt && <>, submitted {when.format(new Date(revision.submittedAt))}</>}
          {live ? (
            <>
              {' '}
              · compared with <Link to={href}>{liveLabel.toLowerCase()}</Link>
            </>
          ) : (
            ' · a new entry'
          )}
        </p>
        {revision.note && (
          <blockquote className="mt-1 border-l-4 border-copper/60 bg-paper-card px-4 py-2 text-sm">
            <span className="font-semibold">Edit note: </span>
            {revision.note}
          </blockquote>
        )}
      </header>
      {d.sinceReturn && <SinceReturn since={d.sinceReturn} />}
      <div className="grid gap-8 lg:grid-cols-[minmax(0,1fr)_18rem]">
        <div className="flex min-w-0 flex-col gap-8">
          <Section id="review-details" title="Changed details">
            <MetadataChanges changes={d.changedFields ?? []} />
          </Section>
          <Section id="review-text" title="Changed text">
            <BodyDiff
              from={String(live?.content.body ?? '')}
              to={String(revision.content.body ?? '')}
              changes={d.bodyDiff ?? []}
              detail={d.bodyDiffDetail}
              fromLabel={liveLabel}
              toLabel={proposedLabel}
              renderWorkedExample={renderWorkedExample}
            />
          </Section>
          <Section id="review-images" title="Changed images">
            <ImageChanges before={String(live?.content.body ?? '')} after={String(revision.content.body ?? '')} />
          </Section>
          <Section id="review-checks" title="Automatic checks">
            <ContentChecks checks={d.checks ?? []} audience="moderator" />
          </Section>
          <Section id="review-warnings" title="Calculator warnings">
            {warningCount === 0 ? (
              <p className="text-sm text-ink-soft">
                The calculators raise no warnings on this proposal’s worked examples{d.setupChanges ? ' or setup record' : ''}.
              </p>
            ) : (
              <div className="flex flex-col gap-4">
                {examples
                  .filter((w) => w.warnings.length > 0 || w.issues.length > 0)
                  .map((w) => (
                    <div key={w.index} className="flex flex-col gap-2">
                      <h3 className="text-sm font-semibold">
                        Worked example {w.index + 1}
                        {w.calc ? ` · ${w.calc}` : ''}
                      </h3>
                      {w.issues.length > 0 && (
                        <WarningList
                          warnings={w.issues.map((i) => ({ level: 'danger' as const, code: 'input', message: i.message, field: i.path || undefined }))}
                        />
                      )}
                      <WarningList warnings={w.warnings} />
                    </div>
                  ))}
                {d.setupWarnings && d.setupWarnings.length > 0 && (
                  <div className="flex flex-col gap-2">
                    <h3 className="text-sm font-semibold">Setup record</h3>
                    <WarningList warnings={d.setupWarnings} />
                  </div>
                )}
              </div>
            )}
          </Section>
          {d.setupChanges && (
            <Section id="review-setup" title="Changed setup-record fields">
              <SetupChangesTable changes={d.setupChanges} />
            </Section>
          )}
          <details className="rounded-md border border-paper-line bg-paper-card p-4">
            <summary className="cursor-pointer font-semibold">Read the proposal as readers would see it</summary>
            <div className="mt-4">
              <Markdown renderWorkedExample={renderWorkedExample}>{String(revision.content.body ?? '')}</Markdown>
            </div>
          </details>
        </div>
        <aside className="lg:sticky lg:top-4 lg:self-start">
          <Decision detail={d} currentUserId={currentUserId} />
        </aside>
      </div>
    </div>
  );
}
