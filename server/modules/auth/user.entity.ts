import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { Role } from '../../../shared/constants';
import type { UnitSystem } from '../../../shared/units';

@Entity({ name: 'users' })
export class UserEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  /** Stored lower-cased; unique. */
  @Column({ type: 'text', unique: true })
  email: string;

  @Column({ type: 'text', name: 'display_name' })
  displayName: string;

  @Column({ type: 'text', name: 'password_hash' })
  passwordHash: string;

  @Column({ type: 'text', default: 'member' })
  role: Role;

  /** Display units (#17); figures are stored in SI whatever this says. */
  @Column({ type: 'text', default: 'metric' })
  units: UnitSystem;

  @Column({ type: 'timestamptz', name: 'email_verified_at', nullable: true })
  emailVerifiedAt: Date | null;

  @Column({ type: 'timestamptz', name: 'disabled_at', nullable: true })
  disabledAt: Date | null;

  /** The person deleted their account: credentials and private data are gone; the row stays as "Former member". */
  @Column({ type: 'timestamptz', name: 'deleted_at', nullable: true })
  deletedAt: Date | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;

  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' })
  updatedAt: Date;
}
