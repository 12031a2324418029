import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { ComparedQuantity, Tolerance } from '../../../shared/motors/quantities';

/** A motor in a member's register. Private to its owner. */
@Entity({ name: 'motors' })
export class MotorEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'owner_id' })
  ownerId: string;

  @Column({ type: 'text' })
  label: string;

  @Column({ type: 'double precision', name: 'kv_rpm_per_v', nullable: true })
  kvRpmPerV: number | null;

  @Column({ type: 'double precision', name: 'wind_turns', nullable: true })
  windTurns: number | null;

  @Column({ type: 'integer' })
  poles: number;

  @Column({ type: 'boolean' })
  sensored: boolean;

  @Column({ type: 'text', name: 'rotor_notes', default: '' })
  rotorNotes: string;

  /** The member's own tolerances per compared quantity; the rest use the defaults. */
  @Column({ type: 'jsonb', default: () => "'{}'::jsonb" })
  tolerances: Partial<Record<ComparedQuantity, Tolerance>>;

  /** The check others are compared with; null means the motor's first check. */
  @Column({ type: 'uuid', name: 'reference_check_id', nullable: true })
  referenceCheckId: string | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;

  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' })
  updatedAt: Date;
}
