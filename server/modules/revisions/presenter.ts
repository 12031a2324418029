import { LRUCache } from 'lru-cache';
import type { GuideRecord, GuideSummary } from '../../../shared/schemas/guide';
import type { DocumentStatus, MyRevision, ReadableRevision, ReviewItem, Revision, RevisionHistoryItem } from '../../../shared/schemas/revision';
import { resolveParameterHref } from '../../../shared/markdown/links';
import { renderMarkdownHtml } from '../../lib/markdown-html';
import { titleOf } from './content';
import type { DocumentEntity } from './document.entity';
import type { RevisionView } from './views';

export type { RevisionView } from './views';
export { titleOf } from './content';

const iso = (d: Date | null) => (d ? d.toISOString() : null);

export function presentRevision(v: RevisionView): Revision {
  const { rev, doc } = v;
  return {
    id: rev.id,
    documentId: doc.id,
    kind: doc.kind,
    slug: doc.slug,
    number: rev.number,
    baseRevisionId: rev.baseRevisionId,
    baseNumber: v.baseNumber,
    state: rev.state,
    note: rev.note,
    reason: rev.reason,
    author: v.author,
    content: rev.content,
    setup: rev.setup,
    restoredFromNumber: rev.restoredFromNumber,
    createdAt: rev.createdAt.toISOString(),
    updatedAt: rev.updatedAt.toISOString(),
    submittedAt: iso(rev.submittedAt),
    publishedAt: iso(rev.publishedAt),
    reviewedAt: iso(rev.reviewedAt),
    reviewedBy: v.reviewer,
    hiddenImages: v.hiddenImages,
  };
}

export function presentHistoryItem(v: RevisionView): RevisionHistoryItem {
  return {
    id: v.rev.id,
    number: v.rev.number,
    state: v.rev.state,
    author: v.author,
    note: v.rev.note,
    baseNumber: v.baseNumber,
    restoredFromNumber: v.rev.restoredFromNumber,
    restoredBy: v.rev.restoredFromNumber != null ? v.reviewer : null,
    createdAt: v.rev.createdAt.toISOString(),
    submittedAt: iso(v.rev.submittedAt),
    publishedAt: iso(v.rev.publishedAt),
  };
}

export function presentDocumentStatus(doc: DocumentEntity, publishedNumber: number | null): DocumentStatus {
  return { kind: doc.kind, slug: doc.slug, publishedRevisionId: doc.publishedRevisionId, publishedNumber, hidden: doc.hiddenAt !== null };
}

const isStale = (v: RevisionView) => (v.rev.baseRevisionId ?? null) !== (v.doc.publishedRevisionId ?? null);

export function presentMyRevision(v: RevisionView): MyRevision {
  const { rev, doc } = v;
  return {
    id: rev.id,
    kind: doc.kind,
    slug: doc.slug,
    title: titleOf(rev),
    number: rev.number,
    state: rev.state,
    note: rev.note,
    reason: rev.reason,
    baseRevisionId: rev.baseRevisionId,
    baseNumber: v.baseNumber,
    // Only work in progress can go stale; a published or superseded revision is history.
    stale: ['draft', 'returned', 'in_review'].includes(rev.state) && isStale(v),
    createdAt: rev.createdAt.toISOString(),
    updatedAt: rev.updatedAt.toISOString(),
    submittedAt: iso(rev.submittedAt),
    publishedAt: iso(rev.publishedAt),
  };
}

export function presentReviewItem(v: RevisionView, viewerId: string): ReviewItem {
  const c = v.rev.content as { class?: unknown };
  return {
    revisionId: v.rev.id,
    kind: v.doc.kind,
    slug: v.doc.slug,
    title: titleOf(v.rev),
    number: v.rev.number,
    baseNumber: v.baseNumber,
    author: v.author,
    submittedAt: iso(v.rev.submittedAt),
    note: v.rev.note,
    class: v.doc.kind === 'guide' && typeof c.class === 'string' ? c.class : null,
    own: v.rev.authorId === viewerId,
    stale: isStale(v),
  };
}

type GuideFields = { title: string; summary: string; class: string; surface: string; conditions?: string; tags?: string[]; parameters?: string[] };

export function presentGuideSummary(v: RevisionView): GuideSummary {
  const c = v.rev.content as GuideFields;
  return {
    slug: v.doc.slug,
    title: c.title,
    summary: c.summary,
    class: c.class,
    surface: c.surface,
    conditions: c.conditions ?? '',
    tags: c.tags ?? [],
    parameters: c.parameters ?? [],
    version: v.rev.number,
    publishedAt: iso(v.rev.publishedAt),
    author: v.author,
  };
}

/** The guide page's record; the moderator-only hiding reason is added only when asked for. */
export function presentGuideRecord(v: RevisionView, opts: { withHiddenReason?: boolean } = {}): GuideRecord {
  return {
    ...presentGuideSummary(v),
    publishedRevisionId: v.rev.id,
    hidden: v.doc.hiddenAt !== null,
    ...(opts.withHiddenReason && v.doc.hiddenAt ? { hiddenReason: v.doc.hiddenReason } : {}),
  };
}

const RENDERED_MAX = 2000;
// Rendered bodies by revision id, last change and hidden images: published and superseded revisions never
// change, so each is rendered once per process (again when a moderator hides or shows one of its images);
// a draft re-renders only after it was edited.
const rendered = new LRUCache<string, string>({ max: RENDERED_MAX });

/** The revision's body as the sanitized HTML reading pages show (cached per revision version). */
export function renderedBody(v: RevisionView): string {
  const key = `${v.rev.id}:${v.rev.updatedAt.getTime()}:${v.hiddenImages.join(',')}`;
  let html = rendered.get(key);
  if (html === undefined) {
    const body = String((v.rev.content as { body?: unknown }).body ?? '');
    const hiddenImages = new Set(v.hiddenImages);
    html = renderMarkdownHtml(body, v.doc.kind === 'parameter' ? { resolveHref: resolveParameterHref, hiddenImages } : { hiddenImages });
    rendered.set(key, html);
  }
  return html;
}

/** A revision for a reading page: presented, plus its rendered body. */
export function presentReadableRevision(v: RevisionView): ReadableRevision {
  return { ...presentRevision(v), bodyHtml: renderedBody(v) };
}
