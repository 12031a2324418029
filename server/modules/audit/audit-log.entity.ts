import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** Who did what, when: one row per state transition or administrative change. */
@Entity({ name: 'audit_log' })
export class AuditLogEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'actor_id', nullable: true })
  actorId: string | null;

  /** e.g. 'revision.submit', 'user.role', 'document.hide'. */
  @Column({ type: 'text' })
  action: string;

  @Column({ type: 'text', name: 'subject_kind' })
  subjectKind: string;

  @Column({ type: 'uuid', name: 'subject_id' })
  subjectId: string;

  @Column({ type: 'text', name: 'from_value', nullable: true })
  from: string | null;

  @Column({ type: 'text', name: 'to_value', nullable: true })
  to: string | null;

  @Column({ type: 'text', nullable: true })
  reason: string | null;

  @Column({ type: 'jsonb', default: {} })
  meta: Record<string, unknown>;

  /** Running number: orders rows written in one transaction (they share created_at). Set by the database. */
  @Column({ type: 'bigint', insert: false, update: false, select: false })
  seq: string;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;
}
