import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** A mail waiting to be (or already) delivered; kept so no mail is lost while SMTP is down. */
@Entity({ name: 'outbox' })
export class OutboxMessageEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'text', name: 'to_address' })
  to: string;

  @Column({ type: 'text' })
  subject: string;

  @Column({ type: 'text', name: 'text_body' })
  text: string;

  @Column({ type: 'text', name: 'html_body', nullable: true })
  html: string | null;

  /** Extra mail headers (List-Unsubscribe and List-Unsubscribe-Post on watch mails). */
  @Column({ type: 'jsonb', nullable: true })
  headers: Record<string, string> | null;

  @Column({ type: 'integer', default: 0 })
  attempts: number;

  @Column({ type: 'text', name: 'last_error', nullable: true })
  lastError: string | null;

  @Column({ type: 'timestamptz', name: 'next_attempt_at' })
  nextAttemptAt: Date;

  @Column({ type: 'timestamptz', name: 'sent_at', nullable: true })
  sentAt: Date | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;
}
