import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { toast } from '@/lib/toast';
import { REVISION_STATE_LABELS } from '@shared/constants';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Dialog } from '@/components/ui/dialog';
import { TextAreaField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { ApiError } from '@/lib/api-client';
import { usePublishRevision, useReturnRevision, type ReviewDetail as Detail } from '../api/reviews';
import { FIELD_LABELS } from '@/components/diff/word-diff-view';

/** Dates and times on the review screen. */
export const when = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });

/** The moderator's decision: publish or approve (after a confirmation of what goes live), or send back with a reason. */
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

export function Decision({ detail, currentUserId }: { detail: Detail; currentUserId: string }) {
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
