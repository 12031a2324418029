import type { DocumentKind } from '../../../shared/constants';
import type { AppContext } from '../../context';
import { changeBaseline } from './commands/baseline';
import { createDocument } from './commands/create';
import { createDraft } from './commands/draft';
import { discard } from './commands/discard';
import { setHidden } from './commands/hide';
import { publish } from './commands/publish';
import { restore } from './commands/restore';
import { returnRevision } from './commands/return';
import { submit } from './commands/submit';
import { updateDraft } from './commands/update';
import { withdraw } from './commands/withdraw';
import { revisionQueries } from './queries';
import type { Member } from './transition';

/**
 * The one revision state machine, for guides and parameters alike: `draft → in_review → published |
 * returned`, withdraw back to draft, restore and hide. Each command lives in commands/<name>.ts and
 * runs in one transaction that first locks the document row, writes an audit-log row and queues its
 * mail in the same transaction (so a mail exists exactly when the change does); what is read lives
 * in queries.ts. This object binds them to the app's context for the route handlers.
 */
export function revisionService(ctx: AppContext) {
  return {
    createDocument: (actor: Member, kind: DocumentKind, input: Record<string, unknown>) => createDocument(ctx, actor, kind, input),
    createDraft: (actor: Member, kind: DocumentKind, slug: string, input: Record<string, unknown>) => createDraft(ctx, actor, kind, slug, input),
    updateDraft: (actor: Member, id: string, input: unknown) => updateDraft(ctx, actor, id, input),
    changeBaseline: (actor: Member, id: string, prepare: Parameters<typeof changeBaseline>[3]) => changeBaseline(ctx, actor, id, prepare),
    submit: (actor: Member, id: string, note: string) => submit(ctx, actor, id, note),
    withdraw: (actor: Member, id: string) => withdraw(ctx, actor, id),
    discard: (actor: Member, id: string) => discard(ctx, actor, id),
    publish: (actor: Member, id: string) => publish(ctx, actor, id),
    returnRevision: (actor: Member, id: string, reason: string) => returnRevision(ctx, actor, id, reason),
    restore: (actor: Member, kind: DocumentKind, slug: string, number: number, reason: string, note?: string) =>
      restore(ctx, actor, kind, slug, number, reason, note),
    setHidden: (actor: Member, kind: DocumentKind, slug: string, hide: boolean, reason: string | null) => setHidden(ctx, actor, kind, slug, hide, reason),
    ...revisionQueries(ctx),
  };
}

export type RevisionService = ReturnType<typeof revisionService>;
