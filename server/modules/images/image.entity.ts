import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** One stored width of an image: its key in storage and its size. */
export type ImageVariant = { width: number; height: number; key: string; bytes: number };

/**
 * An image uploaded into a draft: decoded and re-encoded on the server (never the uploaded bytes), stored
 * at a few widths under server-generated keys. Private to its author and the moderators until a live
 * revision of its document refers to it (`revision_images`, kept by a trigger from revision content).
 */
@Entity({ name: 'images' })
export class ImageEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'owner_id' })
  ownerId: string;

  @Column({ type: 'uuid', name: 'document_id' })
  documentId: string;

  /** The draft it was uploaded into; null once that revision is gone. */
  @Column({ type: 'uuid', name: 'revision_id', nullable: true })
  revisionId: string | null;

  /** Size of the original after orientation was applied. */
  @Column({ type: 'integer' })
  width: number;

  @Column({ type: 'integer' })
  height: number;

  @Column({ type: 'text' })
  format: 'jpeg' | 'png';

  @Column({ type: 'jsonb' })
  variants: ImageVariant[];

  /** Bytes of the upload as received (it is not kept). */
  @Column({ type: 'integer', name: 'byte_size' })
  byteSize: number;

  @Column({ type: 'timestamptz', name: 'hidden_at', nullable: true })
  hiddenAt: Date | null;

  @Column({ type: 'uuid', name: 'hidden_by', nullable: true })
  hiddenBy: string | null;

  @Column({ type: 'text', name: 'hidden_reason', nullable: true })
  hiddenReason: string | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;
}
