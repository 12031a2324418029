import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { BenchReading } from '../../../shared/motors/quantities';

/** One bench check of a motor: every reading as its list of repeats (means and spreads are worked out on the way out). */
@Entity({ name: 'bench_checks' })
export class BenchCheckEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'motor_id' })
  motorId: string;

  @Column({ type: 'timestamptz', name: 'tested_at' })
  testedAt: Date;

  @Column({ type: 'jsonb' })
  readings: Partial<Record<BenchReading, number[]>>;

  @Column({ type: 'double precision', name: 'resistance_temp_c', nullable: true })
  resistanceTempC: number | null;

  @Column({ type: 'text', default: '' })
  notes: string;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;
}
