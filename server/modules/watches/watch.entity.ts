import { Column, CreateDateColumn, Entity, PrimaryColumn, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { WatchDelivery } from '../../../shared/schemas/watch';

/** Someone following a guide or parameter entry; `watching = false` remembers that they stopped. */
@Entity({ name: 'watches' })
export class WatchEntity {
  @PrimaryColumn({ type: 'uuid', name: 'user_id' })
  userId: string;

  @PrimaryColumn({ type: 'uuid', name: 'document_id' })
  documentId: string;

  @Column({ type: 'boolean', default: true })
  watching: boolean;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;

  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' })
  updatedAt: Date;
}

/** How one person wants mail about what they watch. No row means immediately. */
@Entity({ name: 'watch_preferences' })
export class WatchPreferenceEntity {
  @PrimaryColumn({ type: 'uuid', name: 'user_id' })
  userId: string;

  @Column({ type: 'text', default: 'immediate' })
  delivery: WatchDelivery;

  @Column({ type: 'timestamptz', name: 'last_digest_at', nullable: true })
  lastDigestAt: Date | null;
}

/** A change waiting for its watcher's next daily digest. */
@Entity({ name: 'watch_digest_items' })
export class WatchDigestItemEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'user_id' })
  userId: string;

  @Column({ type: 'uuid', name: 'document_id' })
  documentId: string;

  @Column({ type: 'jsonb' })
  change: WatchedChange;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;
}

/** What a watch mail says about one change. */
export type WatchedChange = {
  kind: 'guide' | 'parameter';
  slug: string;
  title: string;
  number: number | null;
  action: 'published' | 'restored' | 'hidden';
  note: string;
  actorName: string;
  diffUrl: string | null;
  pageUrl: string;
  at: string;
};
