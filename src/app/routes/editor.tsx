import { useQuery, useQueryClient } from '@tanstack/react-query';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import type { DocumentKind } from '@shared/constants';
import type { Revision } from '@shared/schemas/revision';
import { Card, PageHeader, Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { RequireRole } from '@/components/layout/guards';
import { guideQueries } from '@/features/guides/api/guides';
import { revisionQueries } from '@/features/editor/api/revisions';
import { DocumentEditor } from '@/features/editor/components/document-editor';
import { renderWorkedExample } from '../worked-example';
import { toast } from '@/lib/toast';
import type { SetupRecord } from '@shared/schemas/setup-record';
import { Button } from '@/components/ui/button';
import { SetupRecordForm, type SetupStart } from '@/features/setups/components/setup-record-form';
import { baselineStart } from '../baseline-start';
import { useAttachSetup } from '@/features/setups/api/setups';
import { EvidencePicker } from '@/features/runs/components/evidence';

/** The draft's baseline setup record: it belongs to this revision, so every version keeps its own. */
function BaselineSection({
  revisionId,
  editable,
  initial,
  start,
}: {
  revisionId: string | null;
  editable: boolean;
  initial: SetupRecord | null;
  start: SetupStart;
}) {
  const attach = useAttachSetup(revisionId ?? '');
  const qc = useQueryClient();
  const handleSave = async (record: SetupRecord | null) => {
    try {
      await attach.mutateAsync(record);
      await qc.invalidateQueries({ queryKey: revisionQueries.detail(revisionId ?? '').queryKey });
      toast.success(record ? 'Baseline saved with this draft' : 'Baseline removed from this draft');
    } catch (err) {
      toast.error((err as Error).message);
    }
  };
  return (
    <Card className="p-5" aria-labelledby="baseline-title" role="region">
      <h2 id="baseline-title" className="text-lg font-semibold">
        Baseline setup record
      </h2>
      <p className="mb-4 text-sm text-ink-soft">
        The setup readers download with this version: fill it in, or load one of your files. Values are checked against the parameter library’s ranges, and the
        review shows every changed field.
      </p>
      {!revisionId ? (
        <Notice>Give the guide a title first; once the draft is saved to your workbench you can attach its baseline.</Notice>
      ) : (
        <fieldset disabled={!editable}>
          <SetupRecordForm
            defaultValue={initial}
            start={start}
            onSubmit={(record) => handleSave(record)}
            submitLabel="Save baseline"
            actions={
              initial ? (
                <Button type="button" variant="secondary" onClick={() => handleSave(null)} pending={attach.isPending}>
                  Remove baseline
                </Button>
              ) : undefined
            }
          />
        </fieldset>
      )}
    </Card>
  );
}

function EditorScreen({ kind, slug }: { kind: DocumentKind; slug: string | null }) {
  const [params, setParams] = useSearchParams();
  const navigate = useNavigate();
  const qc = useQueryClient();
  const draftId = params.get('draft');
  const draft = useQuery({ ...revisionQueries.detail(draftId ?? ''), enabled: !!draftId });
  const live = useQuery({ ...revisionQueries.live(kind, slug ?? ''), enabled: !!slug });
  const mine = useQuery({ ...revisionQueries.mine(), enabled: !!slug && !draftId });
  const parameterOptions = useQuery(guideQueries.parameterOptions()).data ?? [];

  if (draftId && draft.isPending) return <Spinner label="Opening your draft…" />;
  if (draftId && draft.isError)
    return (
      <Notice tone="danger" title="This draft could not be opened">
        {draft.error.message}
      </Notice>
    );
  if (slug && live.isPending && !draftId) return <Spinner label="Loading the live version…" />;
  if (slug && live.isError && !draftId)
    return (
      <Notice tone="danger" title="There is no live version to edit">
        {live.error.message}
      </Notice>
    );

  const existing = !draftId
    ? mine.data?.find((r) => r.kind === kind && r.slug === slug && (r.state === 'draft' || r.state === 'returned' || r.state === 'in_review'))
    : undefined;
  const liveRevision = live.data ?? null;

  const handleCreated = (revision: Revision, newSlug: string) => {
    // Seed the cache so the page keeps the same editor (and its state) once the URL names the draft.
    qc.setQueryData(revisionQueries.detail(revision.id).queryKey, { revision });
    if (kind === 'guide' && !slug) navigate(`/guides/new?draft=${revision.id}`, { replace: true, state: { slug: newSlug } });
    else {
      const next = new URLSearchParams(params);
      next.set('draft', revision.id);
      setParams(next, { replace: true });
    }
  };

  return (
    <div className="flex flex-col gap-4">
      {existing && (
        <Notice tone="caution" title="You already have a revision of this in progress">
          Version {existing.number} is on your workbench.{' '}
          <Link to={kind === 'guide' ? `/guides/${slug}/edit?draft=${existing.id}` : `/parameters/${slug}/edit?draft=${existing.id}`}>Continue that one</Link>{' '}
          rather than starting a second.
        </Notice>
      )}
      <DocumentEditor
        key="editor"
        kind={kind}
        slug={slug ?? draft.data?.revision.slug ?? null}
        draft={draft.data?.revision ?? null}
        live={liveRevision}
        parameterOptions={parameterOptions}
        renderWorkedExample={renderWorkedExample}
        onCreated={handleCreated}
        onSubmitted={() => navigate('/me/revisions')}
        renderBaseline={(revisionId, editable, guide) => (
          <>
            <BaselineSection
              key={revisionId ?? 'new'}
              revisionId={revisionId}
              editable={editable}
              start={baselineStart(guide)}
              initial={((draftId ? draft.data?.revision.setup : liveRevision?.setup) ?? null) as SetupRecord | null}
            />
            {kind === 'guide' && <EvidencePicker revisionId={revisionId} editable={editable} />}
          </>
        )}
      />
    </div>
  );
}

export function GuideNewPage() {
  return (
    <RequireRole role="member">
      {() => (
        <>
          <PageHeader eyebrow="Your workbench" title="Write a guide">
            One class on one track or surface. It saves as you type; a moderator reviews it before it goes live.
          </PageHeader>
          <EditorScreen kind="guide" slug={null} />
        </>
      )}
    </RequireRole>
  );
}

export function GuideEditPage() {
  const { slug = '' } = useParams();
  return (
    <RequireRole role="member">
      {() => (
        <>
          <PageHeader eyebrow="Propose an edit" title="Edit the guide">
            Your changes stay a draft on your workbench until you submit them; the live guide does not change until a moderator publishes them.{' '}
            <Link to={`/guides/${slug}`}>Back to the guide</Link>
          </PageHeader>
          <EditorScreen kind="guide" slug={slug} />
        </>
      )}
    </RequireRole>
  );
}

export function ParameterEditPage() {
  const { slug = '' } = useParams();
  return (
    <RequireRole role="member">
      {() => (
        <>
          <PageHeader eyebrow="Propose an edit" title="Edit the setting’s entry">
            A correction or an addition to the parameter library, reviewed by a moderator before it goes live.{' '}
            <Link to={`/parameters/${slug}`}>Back to the entry</Link>
          </PageHeader>
          <EditorScreen kind="parameter" slug={slug} />
        </>
      )}
    </RequireRole>
  );
}
