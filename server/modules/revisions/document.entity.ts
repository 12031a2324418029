import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { DocumentKind } from '../../../shared/constants';

/** A guide or a parameter entry: a stable slug pointing at its live (published) revision. */
@Entity({ name: 'documents' })
export class DocumentEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'text' })
  kind: DocumentKind;

  @Column({ type: 'text' })
  slug: string;

  @Column({ type: 'uuid', name: 'published_revision_id', nullable: true })
  publishedRevisionId: string | null;

  @Column({ type: 'uuid', name: 'created_by', nullable: true })
  createdBy: string | null;

  @Column({ type: 'timestamptz', name: 'hidden_at', nullable: true })
  hiddenAt: Date | null;

  @Column({ type: 'uuid', name: 'hidden_by', nullable: true })
  hiddenBy: string | null;

  @Column({ type: 'text', name: 'hidden_reason', nullable: true })
  hiddenReason: string | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;

  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' })
  updatedAt: Date;
}
