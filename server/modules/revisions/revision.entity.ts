import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { RevisionState } from '../../../shared/constants';

/** A returned revision as the moderator saw it when sending it back. */
export type ReturnedSnapshot = {
  content: Record<string, unknown>;
  setup: Record<string, unknown> | null;
  reason: string;
  returnedAt: string;
  reviewerId: string;
};

/**
 * One numbered version of a document. Content is immutable once it leaves `draft`;
 * only state fields move, and every move writes an audit-log row.
 */
@Entity({ name: 'revisions' })
export class RevisionEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'document_id' })
  documentId: string;

  @Column({ type: 'integer' })
  number: number;

  @Column({ type: 'uuid', name: 'base_revision_id', nullable: true })
  baseRevisionId: string | null;

  @Column({ type: 'uuid', name: 'author_id' })
  authorId: string;

  @Column({ type: 'text' })
  state: RevisionState;

  /** The author's edit note. */
  @Column({ type: 'text', default: '' })
  note: string;

  /** The moderator's reason when returned. */
  @Column({ type: 'text', nullable: true })
  reason: string | null;

  /** Kind-specific fields (guide or parameter content), validated by the shared zod schemas. */
  @Column({ type: 'jsonb' })
  content: Record<string, unknown>;

  /** The baseline setup record attached to this revision, if any. */
  @Column({ type: 'jsonb', nullable: true })
  setup: Record<string, unknown> | null;

  /** What the moderator sent back (content, baseline, reason, when), kept so the review shows what changed since. */
  @Column({ type: 'jsonb', name: 'returned_snapshot', nullable: true })
  returnedSnapshot: ReturnedSnapshot | null;

  @Column({ type: 'integer', name: 'restored_from_number', nullable: true })
  restoredFromNumber: number | null;

  @Column({ type: 'timestamptz', name: 'submitted_at', nullable: true })
  submittedAt: Date | null;

  @Column({ type: 'uuid', name: 'reviewed_by', nullable: true })
  reviewedBy: string | null;

  @Column({ type: 'timestamptz', name: 'reviewed_at', nullable: true })
  reviewedAt: Date | null;

  @Column({ type: 'timestamptz', name: 'published_at', nullable: true })
  publishedAt: Date | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;

  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' })
  updatedAt: Date;
}
