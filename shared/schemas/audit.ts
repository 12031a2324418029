import { z } from 'zod';
import { DOCUMENT_KINDS } from '../constants';

/** What an audit row is about. */
export const AUDIT_SUBJECT_KINDS = ['revision', 'document', 'user', 'image'] as const;
export type AuditSubjectKind = (typeof AUDIT_SUBJECT_KINDS)[number];
export const AUDIT_SUBJECT_LABELS: Record<AuditSubjectKind, string> = { revision: 'Revision', document: 'Guide or entry', user: 'Account', image: 'Image' };

/** Every action the server writes to the audit log, in our words (the stored value is the key). */
export const AUDIT_ACTION_LABELS = {
  'document.create': 'Started a new guide or entry',
  'revision.create': 'Started a draft',
  'revision.submit': 'Sent for review',
  'revision.withdraw': 'Withdrew from review',
  'revision.rebase': 'Merged with the live version',
  'revision.reopen': 'Reopened a sent-back revision',
  'revision.approve': 'Approved (first of two)',
  'revision.publish': 'Published',
  'revision.return': 'Sent back to the author',
  'revision.archive': 'Superseded',
  'revision.restore': 'Restored an older version',
  'revision.discard': 'Discarded a draft',
  'document.hide': 'Hid from readers',
  'document.unhide': 'Showed to readers again',
  'image.hide': 'Hid an image',
  'image.unhide': 'Showed an image again',
  'user.role': 'Changed a role',
  'user.disable': 'Disabled an account',
  'user.enable': 'Enabled an account',
  'user.delete': 'Deleted an account',
} as const satisfies Record<string, string>;
export type AuditAction = keyof typeof AUDIT_ACTION_LABELS;
export const AUDIT_ACTIONS = Object.keys(AUDIT_ACTION_LABELS) as [AuditAction, ...AuditAction[]];

/** An audit action's label; an action written by newer code than this list reads as itself. */
export const auditActionLabel = (action: string) => (AUDIT_ACTION_LABELS as Record<string, string>)[action] ?? action;

/** The CSV export holds at most this many rows (the newest that match); the page says so. */
export const AUDIT_CSV_MAX_ROWS = 50_000;

const day = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-12-05')
  .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), 'Not a calendar date');

/** Filters of GET /api/audit and /api/audit.csv; dates are whole days in UTC, both ends included. */
export const auditFilterSchema = z.strictObject({
  actor: z.uuid({ message: 'Must be an account id' }).optional(),
  action: z.enum(AUDIT_ACTIONS, { message: 'Not an action the audit log records' }).optional(),
  targetType: z.enum(AUDIT_SUBJECT_KINDS, { message: 'Must be revision, document, user or image' }).optional(),
  targetId: z.uuid({ message: 'Must be an id' }).optional(),
  since: day.optional(),
  until: day.optional(),
});
export type AuditFilter = z.infer<typeof auditFilterSchema>;

export const auditQuerySchema = auditFilterSchema.extend({
  limit: z.coerce.number({ message: 'Must be a number' }).int().min(1).max(200).default(50),
  offset: z.coerce.number({ message: 'Must be a number' }).int().min(0).max(1_000_000).default(0),
});
export type AuditQuery = z.infer<typeof auditQuerySchema>;

const personRef = z.object({ id: z.string(), displayName: z.string() });

/** One audit row as moderators and administrators read it (no e-mail addresses: moderators are not admins). */
export const auditEntrySchema = z.object({
  id: z.string(),
  at: z.string(),
  actor: personRef.nullable(),
  action: z.string(),
  actionLabel: z.string(),
  targetType: z.string(),
  targetId: z.string(),
  /** What the row is about in words: a guide's title and version, an account's display name. */
  target: z.string(),
  /** Where to read it, when there is a page for it. */
  targetHref: z.string().nullable(),
  from: z.string().nullable(),
  to: z.string().nullable(),
  reason: z.string().nullable(),
});
export type AuditEntry = z.infer<typeof auditEntrySchema>;

/** A document moderators hid from readers (GET /api/hidden). */
export const hiddenDocumentSchema = z.object({
  kind: z.enum(DOCUMENT_KINDS),
  slug: z.string(),
  title: z.string(),
  hiddenAt: z.string(),
  hiddenBy: personRef.nullable(),
  reason: z.string().nullable(),
});
export type HiddenDocument = z.infer<typeof hiddenDocumentSchema>;
