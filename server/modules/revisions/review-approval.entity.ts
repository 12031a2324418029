import { Column, Entity, PrimaryColumn } from 'typeorm';

/** A moderator's first approval of a proposal that needs two (see shared/content-checks/safety-changes.ts). */
@Entity({ name: 'review_approvals' })
export class ReviewApprovalEntity {
  @PrimaryColumn({ type: 'uuid', name: 'revision_id' })
  revisionId: string;

  @PrimaryColumn({ type: 'uuid', name: 'moderator_id' })
  moderatorId: string;

  @Column({ type: 'timestamptz', name: 'created_at', default: () => 'now()' })
  createdAt: Date;
}
