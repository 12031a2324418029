import { useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { toast } from '@/lib/toast';
import type { DocumentKind } from '@shared/constants';
import { REVISION_STATE_LABELS } from '@shared/constants';
import { guideContentSchema, guideDraftContentSchema } from '@shared/schemas/guide';
import { parameterContentSchema, type ParameterSummary } from '@shared/schemas/parameter';
import type { Revision } from '@shared/schemas/revision';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ContentChecks } from '@/components/ui/content-checks';
import { Dialog } from '@/components/ui/dialog';
import { TextAreaField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { ApiError } from '@/lib/api-client';
import {
  createGuide,
  createProposal,
  patchRevisionWithChecks,
  revisionQueries,
  useSubmitRevision,
  useWithdrawRevision,
  type EditableContent,
} from '../api/revisions';
import { useAutosave } from '../hooks/use-autosave';
import { clearLocalDraft, localDraftKey, readLocalDraft, shouldOfferRestore, type LocalDraft } from '../lib/autosave';
import { AutosaveStatus } from './autosave-status';
import { BodyField } from './body-field';
import { markdownImages } from '@shared/markdown/images';
import { emptyGuide, GuideFields, toGuideForm, type GuideForm } from './guide-fields';
import { MergeScreen } from './merge-screen';
import { ParameterFields, toParameterForm, type ParameterForm } from './parameter-fields';

type Content = GuideForm | ParameterForm;

const typedAt = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit' });

export type DocumentEditorProps = {
  kind: DocumentKind;
  /** The document's slug; null for a guide that does not exist yet. */
  slug: string | null;
  /** The draft being continued, if any. */
  draft: Revision | null;
  /** The live revision a new proposal starts from (and that a draft's base is checked against). */
  live: Revision | null;
  parameterOptions: ParameterSummary[];
  renderWorkedExample?: (body: string, index: number) => ReactNode;
  /** The first save created a revision: the page records its id in the URL. */
  onCreated: (revision: Revision, slug: string) => void;
  onSubmitted: (revision: Revision) => void;
  /** The guide's baseline setup section, composed by the page (editable while the draft is); it gets the guide's fields as typed, so a new baseline starts from them. */
  renderBaseline?: (revisionId: string | null, editable: boolean, guide: { class: string; surface: string; body: string }) => ReactNode;
};

/** A new guide goes to the server (and the workbench) as soon as it has a title; the rest can follow. */
const minimalNewGuide = guideDraftContentSchema.pick({ title: true });

function issuesByField(error: { issues: Array<{ path: PropertyKey[]; message: string }> }) {
  const out: Record<string, string> = {};
  for (const i of error.issues) {
    const key = i.path.map(String).join('.');
    if (!out[key]) out[key] = i.message;
  }
  return out;
}

function toForm(kind: DocumentKind, content: Record<string, unknown> | null | undefined): Content {
  return kind === 'guide' ? toGuideForm(content) : toParameterForm(content);
}

/**
 * The writing screen for guides and parameter entries: fields, the Markdown body, autosave to the
 * server and the browser, submission with an edit note, and the merge screen when the live version moved on.
 */
export function DocumentEditor({
  kind,
  slug,
  draft,
  live,
  parameterOptions,
  renderWorkedExample,
  onCreated,
  onSubmitted,
  renderBaseline,
}: DocumentEditorProps) {
  const [revisionId, setRevisionId] = useState<string | null>(draft?.id ?? null);
  const [baseRevisionId, setBaseRevisionId] = useState<string | null>(draft ? draft.baseRevisionId : (live?.id ?? null));
  const [state, setState] = useState<Revision['state']>(draft?.state ?? 'draft');
  const serverContent = useMemo(
    () => (draft ? toForm(kind, draft.content) : live ? toForm(kind, live.content) : kind === 'guide' ? emptyGuide : toParameterForm(null)),
    [draft, live, kind],
  );
  const [content, setContent] = useState<Content>(serverContent);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [mode, setMode] = useState<'edit' | 'merge'>('edit');
  const [submitOpen, setSubmitOpen] = useState(false);
  const [note, setNote] = useState(draft?.note ?? '');
  const [noteError, setNoteError] = useState<string>();
  const submit = useSubmitRevision();
  const withdraw = useWithdrawRevision();
  const qc = useQueryClient();
  const storageKey = localDraftKey({ revisionId, kind, slug });
  const slugRef = useRef(slug);
  const bodyRef = useRef<HTMLDivElement>(null);
  // The restore notice goes away with the button that was pressed: carry on where the writing is.
  const focusBody = () => requestAnimationFrame(() => bodyRef.current?.querySelector('textarea')?.focus());

  // A newer copy in this browser than on the server (a reload before the last save, or a dropped connection)?
  const [offer, setOffer] = useState<LocalDraft<Content> | null>(() => {
    const local = readLocalDraft<Content>(window.localStorage, storageKey);
    return shouldOfferRestore(local, { content: serverContent, updatedAt: draft?.updatedAt ?? null }) ? local : null;
  });

  const editable = state === 'draft' || state === 'returned';
  const canCreate = kind === 'guide' && !slugRef.current && !revisionId ? minimalNewGuide.safeParse(content).success : true;

  // The id as soon as the create call answers: a save queued behind it must patch, not create a second guide
  // (the state and the closures that read it catch up only at the next render).
  const createdId = useRef<string | null>(draft?.id ?? null);
  const save = async (c: Content) => {
    const currentId = createdId.current ?? revisionId;
    try {
      if (!currentId) {
        if (kind === 'guide' && !slugRef.current) {
          const res = await createGuide(c as unknown as EditableContent);
          createdId.current = res.revision.id;
          slugRef.current = res.guide.slug;
          setRevisionId(res.revision.id);
          setBaseRevisionId(res.revision.baseRevisionId);
          onCreated(res.revision, res.guide.slug);
        } else {
          if (!baseRevisionId || !slugRef.current) throw new ApiError(409, 'no_base', 'There is no live version to base the edit on.');
          const rev = await createProposal(kind, slugRef.current, baseRevisionId, c as unknown as EditableContent);
          createdId.current = rev.id;
          setRevisionId(rev.id);
          onCreated(rev, slugRef.current);
        }
      } else {
        const { checks: found } = await patchRevisionWithChecks(currentId, c as unknown as EditableContent);
        qc.setQueryData(revisionQueries.detail(currentId).queryKey, (old) => (old ? { ...old, checks: found } : old));
      }
      setErrors({});
    } catch (err) {
      if (err instanceof ApiError && err.code === 'validation_failed') setErrors(err.fieldErrors);
      throw err;
    }
  };

  const autosave = useAutosave<Content>({
    storageKey,
    content,
    savedContent: draft ? serverContent : null,
    savedAt: draft?.updatedAt ?? null,
    startingContent: serverContent,
    save,
    canSave: editable && canCreate,
    cannotSaveReason: editable ? 'Kept in this browser — give it a title to save it to your workbench' : 'Not editable in this state',
  });

  useEffect(() => {
    if (draft?.state) setState(draft.state);
  }, [draft?.state]);

  const detail = useQuery({ ...revisionQueries.detail(revisionId ?? ''), enabled: !!revisionId });
  const checks = detail.data?.checks ?? [];

  const update = (patch: Partial<Content>) => setContent((c) => ({ ...c, ...patch }) as Content);
  const staleBase = !!(revisionId && live && baseRevisionId && live.id !== baseRevisionId);

  const handleSubmit = async () => {
    const schema = kind === 'guide' ? guideContentSchema : parameterContentSchema;
    const parsed = schema.safeParse(content);
    if (!parsed.success) {
      setErrors(issuesByField(parsed.error));
      setSubmitOpen(false);
      toast.error('Some fields need attention before the draft can go to review.');
      return;
    }
    if (markdownImages(content.body).some((img) => !img.alt)) {
      setErrors({ body: 'Every image needs alt text: fill in the fields below the editor, then submit.' });
      setSubmitOpen(false);
      toast.error('Every image needs alt text before the draft can go to review.');
      return;
    }
    if (note.trim().length < 3) {
      setNoteError('Write an edit note: what changed and why (the moderator reads it first).');
      return;
    }
    const saved = await autosave.flush();
    if (!saved || !revisionId) {
      setNoteError(
        'The draft could not be saved to the server just now, so it cannot be submitted. It is kept in this browser; try again when the connection is back.',
      );
      return;
    }
    try {
      const res = await submit.mutateAsync({ id: revisionId, note: note.trim() });
      setState('in_review');
      setSubmitOpen(false);
      toast.success('Submitted: a moderator will review it');
      onSubmitted(res.revision);
    } catch (err) {
      if (err instanceof ApiError && err.code === 'stale_base') {
        // The 409 names the live revision: take it as the page's "live", so once the merge moves the
        // draft's base onto it the editor does not warn about a change it has already merged.
        const current = (err.details as { current?: Revision | null } | undefined)?.current;
        if (current && slugRef.current) qc.setQueryData(revisionQueries.live(kind, slugRef.current).queryKey, current);
        setSubmitOpen(false);
        setMode('merge');
        return;
      }
      if (err instanceof ApiError && err.code === 'content_check_failed') {
        void qc.invalidateQueries({ queryKey: revisionQueries.detail(revisionId).queryKey });
        setNoteError('The automatic checks found errors to fix first; they are listed under "Automatic checks".');
        return;
      }
      if (err instanceof ApiError && err.code === 'image_check_failed') {
        const first = Array.isArray(err.details) ? (err.details[0] as { message?: string } | undefined)?.message : undefined;
        setNoteError([err.message, first].filter(Boolean).join(' '));
        return;
      }
      if (err instanceof ApiError && err.fieldErrors.note) setNoteError(err.fieldErrors.note);
      else setNoteError((err as Error).message);
    }
  };

  const handleWithdraw = async () => {
    if (!revisionId) return;
    try {
      await withdraw.mutateAsync(revisionId);
      setState('draft');
      focusBody(); // the button that was pressed is gone; the author withdrew to write
      toast.success('Withdrawn: it is a draft on your workbench again');
    } catch (err) {
      toast.error((err as Error).message);
    }
  };

  if (mode === 'merge' && revisionId) {
    return (
      <MergeScreen
        revisionId={revisionId}
        kindLabel={kind === 'guide' ? 'guide' : 'entry'}
        yours={content as unknown as Record<string, unknown>}
        onCancel={() => setMode('edit')}
        onSaved={(merged, currentRevisionId) => {
          const form = toForm(kind, merged);
          setContent(form);
          setBaseRevisionId(currentRevisionId);
          autosave.markSaved(form);
          setMode('edit');
          // The live version may have moved again while the author was merging; the banner will say so.
          if (slugRef.current) void qc.invalidateQueries({ queryKey: revisionQueries.live(kind, slugRef.current).queryKey });
          toast.success('Merged and saved. Check it over, then submit again.');
        }}
      />
    );
  }

  return (
    <div className="flex flex-col gap-5">
      <div className="sticky top-0 z-10 -mx-4 flex flex-wrap items-center justify-between gap-3 border-b border-paper-line bg-paper/95 px-4 py-2 backdrop-blur">
        <AutosaveStatus status={autosave.status} />
        <div className="flex flex-wrap items-center gap-2">
          <span className="text-sm text-ink-muted">{REVISION_STATE_LABELS[state]}</span>
          {state === 'in_review' ? (
            <Button variant="secondary" size="sm" onClick={handleWithdraw} pending={withdraw.isPending}>
              Withdraw to edit
            </Button>
          ) : (
            <Button size="sm" onClick={() => setSubmitOpen(true)} disabled={!editable}>
              Submit for review
            </Button>
          )}
        </div>
      </div>
      {offer && (
        <Notice tone="caution" title="This browser holds newer text for this draft">
          <p>
            It was typed {typedAt.format(new Date(offer.editedAt))} and never reached the server (a reload or a dropped connection). Restore it to carry on from
            there; it is saved to the server once the connection allows.
          </p>
          <div className="mt-2 flex flex-wrap gap-2">
            <Button
              size="sm"
              onClick={() => {
                setContent(offer.content);
                setOffer(null);
                focusBody();
              }}
            >
              Restore the newer text
            </Button>
            <Button
              size="sm"
              variant="secondary"
              onClick={() => {
                clearLocalDraft(window.localStorage, storageKey);
                setOffer(null);
                focusBody();
              }}
            >
              Keep the saved version
            </Button>
          </div>
        </Notice>
      )}
      {state === 'returned' && draft?.reason && (
        <Notice tone="caution" title={`Sent back by ${draft.reviewedBy?.displayName ?? 'the moderator'}`}>
          <p>{draft.reason}</p>
          <p className="mt-1 text-ink-soft">Change what is asked, then submit it again; it goes back into the review queue as this same version.</p>
        </Notice>
      )}
      {state === 'in_review' && (
        <Notice title="Waiting for review">
          A moderator will publish it or send it back with a reason. Withdraw it if you want to change something first.
        </Notice>
      )}
      {staleBase && editable && (
        <Notice tone="caution" title={`The live version changed since you started (now version ${live?.number})`}>
          <p>Merge your draft with it before submitting; non-overlapping changes merge by themselves.</p>
          <Button size="sm" className="mt-2" onClick={() => setMode('merge')}>
            Merge with the live version
          </Button>
        </Notice>
      )}
      <fieldset disabled={!editable} className="grid gap-6 lg:grid-cols-[20rem_minmax(0,1fr)]">
        <legend className="sr-only">{kind === 'guide' ? 'Guide details' : 'Entry details'}</legend>
        <Card className="h-fit p-4">
          {kind === 'guide' ? (
            <GuideFields value={content as GuideForm} onChange={update} errors={errors} parameterOptions={parameterOptions} />
          ) : (
            <ParameterFields slug={slug ?? ''} value={content as ParameterForm} onChange={update} errors={errors} parameterOptions={parameterOptions} />
          )}
        </Card>
        <div className="min-w-0" ref={bodyRef}>
          <BodyField
            revisionId={revisionId}
            value={content.body}
            onChange={(body) => update({ body })}
            error={errors.body}
            renderWorkedExample={renderWorkedExample}
          />
        </div>
      </fieldset>
      {kind === 'guide' &&
        renderBaseline &&
        renderBaseline(revisionId, editable, { class: (content as GuideForm).class, surface: (content as GuideForm).surface, body: content.body })}
      {revisionId && (
        <section aria-labelledby="editor-checks" className="flex flex-col gap-2">
          <h2 id="editor-checks" className="text-lg font-semibold">
            Automatic checks
          </h2>
          <p className="text-sm text-ink-soft">
            Run on every save against the calculators and the parameter library. Errors must be fixed before you submit; warnings go to the moderator with your
            proposal.
          </p>
          <ContentChecks checks={checks} audience="author" />
        </section>
      )}
      <Dialog
        open={submitOpen}
        onClose={() => setSubmitOpen(false)}
        title="Submit for review"
        footer={
          <>
            <Button variant="secondary" onClick={() => setSubmitOpen(false)}>
              Keep writing
            </Button>
            <Button onClick={handleSubmit} pending={submit.isPending}>
              Submit
            </Button>
          </>
        }
      >
        <TextAreaField
          label="Edit note"
          hint="What changed and why — e.g. “Drag brake up 4 % for the dusty afternoon clay”. The moderator reads it first and it stays in the history."
          rows={4}
          value={note}
          onChange={(e) => {
            setNote(e.target.value);
            setNoteError(undefined);
          }}
          error={noteError}
          required
        />
      </Dialog>
    </div>
  );
}
