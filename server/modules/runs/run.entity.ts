import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

/**
 * A member's run log: the uploaded file and its parsed columns in storage (server-generated keys), the
 * mapping, import notes and figures here. Private to its owner; public only as evidence on a live revision.
 */
@Entity({ name: 'runs' })
export class RunEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'owner_id' })
  ownerId: string;

  /** One of the owner's uploaded setups, or null; cleared if that setup is deleted. */
  @Column({ type: 'uuid', name: 'setup_id', nullable: true })
  setupId: string | null;

  /** One of the owner's registered motors, or null; cleared if that motor is deleted. */
  @Column({ type: 'uuid', name: 'motor_id', nullable: true })
  motorId: string | null;

  @Column({ type: 'text' })
  title: string;

  @Column({ type: 'text', name: 'original_name' })
  originalName: string;

  @Column({ type: 'integer', name: 'byte_size' })
  byteSize: number;

  /** The file as uploaded. */
  @Column({ type: 'text', name: 'raw_key' })
  rawKey: string;

  /** The parsed channels as 32-bit float columns (shared/runlog/columnar.ts). */
  @Column({ type: 'text', name: 'data_key' })
  dataKey: string;

  @Column({ type: 'integer', name: 'data_bytes' })
  dataBytes: number;

  @Column({ type: 'jsonb' })
  channels: string[];

  @Column({ type: 'jsonb' })
  mapping: Record<string, unknown>;

  @Column({ type: 'jsonb', name: 'import_notes' })
  importNotes: Array<{ code: string; message: string; rows?: number[] }>;

  @Column({ type: 'jsonb' })
  gaps: Array<{ fromS: number; toS: number }>;

  @Column({ type: 'jsonb' })
  summary: Record<string, unknown>;

  /** Invented by the simulator for the demo guides. */
  @Column({ type: 'boolean' })
  demo: boolean;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;
}
