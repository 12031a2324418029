import { useState, type ReactNode } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link, useNavigate } from 'react-router-dom';
import { toast } from '@/lib/toast';
import { REVISION_STATE_LABELS } from '@shared/constants';
import type { CalcWarning } from '@shared/calc/types';
import { BodyDiff, MetadataChanges, setupValueText } from './review-diffs';
import { Button } from '@/components/ui/button';
import { Card, Spinner } from '@/components/ui/card';
import { Dialog } from '@/components/ui/dialog';
import { TextAreaField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { ApiError } from '@/lib/api-client';
import { Markdown } from '@/lib/markdown';
import { reviewQueries, usePublishRevision, useReturnRevision, type ReviewDetail as Detail, type SetupChange } from '../api/reviews';
import { ContentChecks } from '@/components/ui/content-checks';
import { ImageChanges } from './image-changes';
import { FIELD_LABELS, WordDiffView } from '@/components/diff/word-diff-view';

const when = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });

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
function GoesLive({ detail, firstApproval }: { detail: Detail; firstApproval: boolean }) {
  const { revision, live } = detail;
  const title = String(revision.content.title ?? revision.content.name ?? 'Untitled');
  const fields = (detail.changedFields ?? []).map((c) => (c as { label?: string }).label ?? FIELD_LABELS[c.field] ?? c.field);
  const textChanges = (detail.bodyDiff ?? []).filter((p) => p.added || p.removed).length;
  const setupChanges = detail.setupChanges?.length ?? 0;
  const findings = detail.checks ?? [];
  const errors = findings.filter((c) => c.severity === 'error').length;
  return (
    <div className="flex flex-col gap-3 text-sm" data-testid="goes-live">
      <p>
        {firstApproval ? (
          <>
            Your approval of version {revision.number} of <strong>{title}</strong> by {revision.author.displayName} is recorded. Nothing goes live yet: a second
            moderator has to approve it too.
          </>
        ) : live ? (
          <>
            Readers will see version {revision.number} of <strong>{title}</strong> by {revision.author.displayName} in place of live version {live.number},
            which becomes superseded. The author is told by e-mail.
          </>
        ) : (
          <>
            <strong>{title}</strong> by {revision.author.displayName} goes live as a new {revision.kind === 'guide' ? 'guide' : 'entry'}: readers can find it
            and read it at once. The author is told by e-mail.
          </>
        )}
      </p>
      <ul className="list-disc pl-5 text-ink-soft">
        {live && (
          <>
            <li>{fields.length === 0 ? 'No details change besides the text.' : `Changed details: ${fields.join(', ')}.`}</li>
            <li>{textChanges === 0 ? 'The text is unchanged.' : `The text changes in ${textChanges} ${textChanges === 1 ? 'place' : 'places'}.`}</li>
          </>
        )}
        {detail.setupChanges && (
          <li>
            {setupChanges === 0 ? 'The setup record is unchanged.' : `${setupChanges} setup-record ${setupChanges === 1 ? 'field changes' : 'fields change'}.`}
          </li>
        )}
        <li>
          {findings.length === 0
            ? 'The automatic checks found nothing.'
            : `The automatic checks found ${findings.length} ${findings.length === 1 ? 'thing' : 'things'}${errors ? `, ${errors} of them ${errors === 1 ? 'an error' : 'errors'}` : ''}: see “Automatic checks”.`}
        </li>
      </ul>
      <p className="text-xs text-ink-muted">Press Escape or Cancel to go back without changing anything.</p>
    </div>
  );
}

function Decision({ detail, currentUserId }: { detail: Detail; currentUserId: string }) {
  const navigate = useNavigate();
  const { revision } = detail;
  const publish = usePublishRevision(revision.id);
  const ret = useReturnRevision(revision.id);
  const [returning, setReturning] = useState(false);
  const [confirming, setConfirming] = useState(false);
  const [reason, setReason] = useState('');
  const [reasonError, setReasonError] = useState<string>();
  const [conflict, setConflict] = useState<string | null>(null);
  const own = detail.own || revision.author.id === currentUserId;
  const waiting = revision.state === 'in_review';
  const approvedByMe = !!detail.approval?.approvals.some((a) => a.moderator.id === currentUserId) && waiting;

  const twoStep = detail.approval?.needed === 2;
  const firstApproval = twoStep && (detail.approval?.approvals.length ?? 0) === 0;
  const handlePublish = async () => {
    setConfirming(false);
    try {
      const res = await publish.mutateAsync();
      if (res.approval) {
        toast.success('Approval recorded: a second moderator has to publish it');
        return;
      }
      toast.success('Published: it is live now');
      navigate('/review');
    } catch (err) {
      if (err instanceof ApiError && err.code === 'stale_base')
        setConflict(
          'The live version changed after this proposal was written. Return it so the author can merge their edit with the new live text; nothing they wrote is lost.',
        );
      else toast.error((err as Error).message);
    }
  };
  const handleReturn = async () => {
    if (!reason.trim()) {
      setReasonError('Give the author a reason: it is sent to them and kept with the revision.');
      return;
    }
    try {
      await ret.mutateAsync(reason.trim());
      toast.success('Sent back to the author');
      setReturning(false);
      navigate('/review');
    } catch (err) {
      if (err instanceof ApiError && err.fieldErrors.reason) setReasonError(err.fieldErrors.reason);
      else setReasonError((err as Error).message);
    }
  };

  return (
    <Card className="flex flex-col gap-3 p-4">
      <h2 className="text-base font-semibold">Decision</h2>
      {!waiting && <Notice title={`This revision is ${REVISION_STATE_LABELS[revision.state].toLowerCase()}`}>It is no longer waiting for review.</Notice>}
      {own && (
        <Notice tone="caution" title="This is your own revision">
          Another moderator has to review it: nobody publishes or returns their own edit.
        </Notice>
      )}
      {(conflict || (detail.stale && waiting)) && (
        <Notice tone="caution" title="Based on an older live version">
          {conflict ??
            'The live version changed after this proposal was written, so it cannot be published as it is. Send it back so the author can merge their edit with the new live text; nothing they wrote is lost.'}
        </Notice>
      )}
      <SecondApproval approval={detail.approval} />
      <div className="flex flex-wrap gap-2">
        <Button
          onClick={() => setConfirming(true)}
          pending={publish.isPending}
          disabled={own || !waiting || detail.stale || approvedByMe}
          aria-describedby={own ? 'own-revision-why' : undefined}
        >
          {detail.approval?.needed === 2 &&
            (approvedByMe
              ? 'Approved: waiting for a second moderator'
              : detail.approval.approvals.length === 0
                ? 'Approve (1 of 2)'
                : 'Approve and publish (2 of 2)')}
          {detail.approval?.needed !== 2 && 'Publish'}
        </Button>
        <Button variant="secondary" onClick={() => setReturning(true)} disabled={own || !waiting}>
          Send back with a reason
        </Button>
      </div>
      {own && (
        <p id="own-revision-why" className="text-xs text-ink-muted">
          Disabled because you are the author.
        </p>
      )}
      <Dialog
        open={confirming}
        onClose={() => setConfirming(false)}
        title={firstApproval ? 'Record your approval?' : twoStep ? 'Approve and publish?' : 'Publish this version?'}
        footer={
          <>
            <Button variant="secondary" onClick={() => setConfirming(false)}>
              Cancel
            </Button>
            <Button onClick={handlePublish} pending={publish.isPending}>
              {firstApproval ? 'Record my approval' : twoStep ? 'Approve and publish now' : 'Publish now'}
            </Button>
          </>
        }
      >
        <GoesLive detail={detail} firstApproval={firstApproval} />
      </Dialog>
      <Dialog
        open={returning}
        onClose={() => setReturning(false)}
        title="Send this revision back"
        footer={
          <>
            <Button variant="secondary" onClick={() => setReturning(false)}>
              Cancel
            </Button>
            <Button onClick={handleReturn} pending={ret.isPending}>
              Send back
            </Button>
          </>
        }
      >
        <TextAreaField
          label="Reason for the author"
          hint="Say what to change. The author gets it by e-mail and sees it on their workbench."
          rows={5}
          value={reason}
          onChange={(e) => {
            setReason(e.target.value);
            setReasonError(undefined);
          }}
          error={reasonError}
          required
        />
      </Dialog>
    </Card>
  );
}

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

/** Why a proposal needs two moderators and who has approved it (safety-relevant baseline changes). */
function SecondApproval({ approval }: { approval?: Detail['approval'] }) {
  if (!approval || approval.needed !== 2) return null;
  return (
    <Notice tone="caution" title="Needs two moderators" className="text-sm">
      <p>This proposal changes the baseline in a way that can damage equipment, so two different moderators must approve it:</p>
      <ul className="my-1 list-disc pl-5" aria-label="Why two moderators">
        {approval.rules.map((r) => (
          <li key={`${r.rule}-${r.path}`}>{r.message}</li>
        ))}
      </ul>
      <p data-testid="approvals">
        {approval.approvals.length === 0
          ? 'No approvals yet.'
          : `Approved by ${approval.approvals.map((a) => `${a.moderator.displayName} (${when.format(new Date(a.at))})`).join(', ')}.`}
      </p>
    </Notice>
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
