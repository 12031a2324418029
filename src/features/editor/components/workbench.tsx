import { useEffect, useRef, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { toast } from '@/lib/toast';
import { REVISION_STATE_LABELS } from '@shared/constants';
import { Button } from '@/components/ui/button';
import { Card, Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { Dialog } from '@/components/ui/dialog';
import { FieldChangesTable, FIELD_LABELS, WordDiffView } from '@/components/diff/word-diff-view';
import { revisionQueries, useDiscardRevision, useWithdrawRevision, type MyRevision } from '../api/revisions';

const when = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });

function editHref(r: MyRevision) {
  return r.kind === 'guide'
    ? r.number === 1 && !r.baseRevisionId
      ? `/guides/new?draft=${r.id}`
      : `/guides/${r.slug}/edit?draft=${r.id}`
    : `/parameters/${r.slug}/edit?draft=${r.id}`;
}

function viewHref(r: MyRevision) {
  return r.kind === 'guide' ? `/guides/${r.slug}/v/${r.number}` : `/parameters/${r.slug}`;
}

const tone: Record<MyRevision['state'], string> = {
  draft: 'border-paper-line bg-paper-deep text-ink-soft',
  in_review: 'border-caution-line bg-caution-wash text-caution',
  returned: 'border-danger-line bg-danger-wash text-danger',
  published: 'border-ok-line bg-ok-wash text-ok',
  archived: 'border-paper-line bg-paper-deep text-ink-soft',
};

/** A sent-back proposal's changes against the version it was based on, beside the moderator's reason. */
function ProposedChanges({ r }: { r: MyRevision }) {
  const [open, setOpen] = useState(false);
  const compare = useQuery({ ...revisionQueries.compare(r.kind, r.slug, r.baseNumber ?? 0, r.number), enabled: open && r.baseNumber !== null });
  if (r.baseNumber === null)
    return <p className="mt-2 text-sm text-ink-soft">A new {r.kind === 'guide' ? 'guide' : 'entry'}: everything in it is what you proposed.</p>;
  return (
    <details className="mt-2" onToggle={(e) => setOpen((e.currentTarget as HTMLDetailsElement).open)}>
      <summary className="cursor-pointer text-sm font-medium text-copper-dark">What you proposed (changes against version {r.baseNumber})</summary>
      <div className="mt-2 flex flex-col gap-3">
        {compare.isPending && <Spinner label="Comparing…" />}
        {compare.isError && <Notice tone="danger">{compare.error.message}</Notice>}
        {compare.data && (
          <>
            <FieldChangesTable
              changes={compare.data.changedFields.map((f) => ({ ...f, label: FIELD_LABELS[f.field] ?? f.field }))}
              fromLabel={`Version ${r.baseNumber}`}
              toLabel="Your version"
            />
            <WordDiffView changes={compare.data.bodyDiff} fromLabel={`Version ${r.baseNumber}`} toLabel="Your version" detail={compare.data.bodyDiffDetail} />
          </>
        )}
      </div>
    </details>
  );
}

function Row({ r, focusEdit, onWithdrawn }: { r: MyRevision; focusEdit: boolean; onWithdrawn: (id: string) => void }) {
  const withdraw = useWithdrawRevision();
  const discard = useDiscardRevision();
  const [confirming, setConfirming] = useState(false);
  const name = r.title || 'untitled draft';
  const handleDiscard = async () => {
    try {
      await discard.mutateAsync(r.id);
      setConfirming(false);
      toast.success(`Discarded: ${name}`);
    } catch (err) {
      toast.error((err as Error).message);
    }
  };
  const editable = r.state === 'draft' || r.state === 'returned';
  const editRef = useRef<HTMLAnchorElement>(null);
  // A withdrawn proposal moves to "Drafts" and its Withdraw button is gone: keep the focus on it there.
  useEffect(() => {
    if (focusEdit && editable) editRef.current?.focus();
  }, [focusEdit, editable]);
  const handleWithdraw = async () => {
    try {
      await withdraw.mutateAsync(r.id);
      onWithdrawn(r.id);
      toast.success('Withdrawn: it is a draft again');
    } catch (err) {
      toast.error((err as Error).message);
    }
  };
  return (
    <li>
      <Card className="flex flex-col gap-2 p-4 sm:flex-row sm:items-start sm:justify-between">
        <div className="min-w-0">
          <p className="flex flex-wrap items-center gap-2">
            <span className={`inline-flex rounded-full border px-2 py-0.5 text-xs font-medium ${tone[r.state]}`}>{REVISION_STATE_LABELS[r.state]}</span>
            <span className="text-xs text-ink-muted">
              {r.kind === 'guide' ? 'Guide' : 'Setting'} · version {r.number}
              {r.baseNumber ? ` · based on version ${r.baseNumber}` : ' · new'}
            </span>
          </p>
          <h3 className="mt-1 font-serif text-lg font-bold">{r.title || 'Untitled draft'}</h3>
          <p className="text-xs text-ink-muted">
            Last changed {when.format(new Date(r.updatedAt))}
            {r.submittedAt ? ` · submitted ${when.format(new Date(r.submittedAt))}` : ''}
          </p>
          {r.note && <p className="mt-1 text-sm text-ink-soft">Edit note: {r.note}</p>}
          {r.state === 'returned' && r.reason && (
            <Notice tone="caution" title="The moderator’s reason" className="mt-2">
              {r.reason}
            </Notice>
          )}
          {r.state === 'returned' && <ProposedChanges r={r} />}
          {r.stale && editable && <p className="mt-1 text-sm text-caution">The live version has changed since; you will be offered a merge.</p>}
        </div>
        <div className="flex shrink-0 flex-wrap gap-2">
          {editable && (
            <Link
              ref={editRef}
              to={editHref(r)}
              aria-label={`Continue editing: ${r.title || 'untitled draft'}`}
              className="rounded-md border border-copper-dark bg-copper px-3 py-1.5 text-sm font-medium text-white no-underline hover:bg-copper-dark"
            >
              Continue editing
            </Link>
          )}
          {r.state === 'in_review' && (
            <>
              <Link
                to={editHref(r)}
                aria-label={`Open: ${name}`}
                className="rounded-md border border-ink/25 px-3 py-1.5 text-sm font-medium text-ink no-underline hover:bg-paper-deep"
              >
                Open
              </Link>
              <Button size="sm" variant="secondary" onClick={handleWithdraw} pending={withdraw.isPending} aria-label={`Withdraw: ${name}`}>
                Withdraw
              </Button>
            </>
          )}
          {editable && (
            <Button size="sm" variant="secondary" onClick={() => setConfirming(true)} aria-label={`Discard: ${name}`}>
              Discard
            </Button>
          )}
          {(r.state === 'published' || r.state === 'archived') && (
            <Link
              to={viewHref(r)}
              aria-label={`View: ${r.title}, version ${r.number}`}
              className="rounded-md border border-ink/25 px-3 py-1.5 text-sm font-medium text-ink no-underline hover:bg-paper-deep"
            >
              View
            </Link>
          )}
        </div>
      </Card>
      <Dialog
        open={confirming}
        onClose={() => setConfirming(false)}
        title="Discard this draft?"
        footer={
          <>
            <Button variant="secondary" onClick={() => setConfirming(false)}>
              Keep it
            </Button>
            <Button variant="danger" onClick={handleDiscard} pending={discard.isPending}>
              Discard
            </Button>
          </>
        }
      >
        <p>
          “{name}”, version {r.number}, goes for good
          {r.number === 1 && !r.baseRevisionId ? ': it was never live, so the guide goes with it' : '; the live version does not change'}. Runs you attached
          stay in your run logs.
        </p>
      </Dialog>
    </li>
  );
}

const GROUPS: Array<{ title: string; states: MyRevision['state'][]; empty: string }> = [
  { title: 'Sent back to you', states: ['returned'], empty: '' },
  { title: 'Drafts', states: ['draft'], empty: 'No drafts. Start one from a guide (“Propose an edit”) or write a new guide.' },
  { title: 'Waiting for review', states: ['in_review'], empty: 'Nothing waiting for review.' },
  { title: 'Published and superseded', states: ['published', 'archived'], empty: '' },
];

/** The member's own drafts and proposals, grouped by where they stand. */
export function Workbench() {
  const mine = useQuery(revisionQueries.mine());
  const [withdrawnId, setWithdrawnId] = useState<string | null>(null);
  if (mine.isPending) return <Spinner label="Loading your workbench…" />;
  if (mine.isError)
    return (
      <Notice tone="danger" title="Your workbench could not be loaded">
        {mine.error.message}
      </Notice>
    );
  return (
    <div className="flex flex-col gap-8">
      {GROUPS.map((g) => {
        const rows = mine.data.filter((r) => g.states.includes(r.state)).sort((a, b) => b.updatedAt.localeCompare(a.updatedAt));
        if (rows.length === 0 && !g.empty) return null;
        return (
          <section key={g.title} aria-labelledby={`wb-${g.states[0]}`} className="flex flex-col gap-3">
            <h2 id={`wb-${g.states[0]}`} className="text-lg font-semibold">
              {g.title} <span className="text-sm font-normal text-ink-muted">({rows.length})</span>
            </h2>
            {rows.length === 0 ? (
              <p className="text-sm text-ink-soft">{g.empty}</p>
            ) : (
              <ul className="flex flex-col gap-3">
                {rows.map((r) => (
                  <Row key={r.id} r={r} focusEdit={r.id === withdrawnId} onWithdrawn={setWithdrawnId} />
                ))}
              </ul>
            )}
          </section>
        );
      })}
    </div>
  );
}
