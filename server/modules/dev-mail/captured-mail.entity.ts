import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** A mail received by the local catcher (development and tests only). */
@Entity({ name: 'captured_mail' })
export class CapturedMailEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'text', name: 'to_address' })
  to: string;

  @Column({ type: 'text', name: 'from_address' })
  from: string;

  @Column({ type: 'text' })
  subject: string;

  @Column({ type: 'text', name: 'text_body' })
  text: string;

  @Column({ type: 'text', name: 'html_body', nullable: true })
  html: string | null;

  /** Extra mail headers (List-Unsubscribe and List-Unsubscribe-Post on watch mails). */
  @Column({ type: 'jsonb', nullable: true })
  headers: Record<string, string> | null;

  @Column({ type: 'timestamptz', name: 'received_at' })
  receivedAt: Date;
}
