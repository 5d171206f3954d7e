import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/**
 * E-mail waiting to be sent. Rows are written in the same transaction as what caused them and
 * sent by the `mail` job; after a successful send the bodies are cleared (they may hold links
 * with one-time tokens).
 */
@Entity({ name: 'mail_outbox' })
@Index('idx_mail_outbox_status', ['status'])
export class MailOutboxEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'text' })
  kind: string;

  @Column({ type: 'text', name: 'to_address' })
  toAddress: string;

  @Column({ type: 'text' })
  subject: string;

  @Column({ type: 'text', name: 'text_body', nullable: true })
  textBody: string | null;

  @Column({ type: 'text', name: 'html_body', nullable: true })
  htmlBody: string | null;

  /** pending | sent | failed */
  @Column({ type: 'text', default: 'pending' })
  status: string;

  @Column({ type: 'integer', default: 0 })
  attempts: number;

  @Column({ type: 'text', name: 'last_error', nullable: true })
  lastError: string | null;

  @Column({ type: 'uuid', name: 'related_id', nullable: true })
  relatedId: string | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;

  @Column({ type: 'timestamptz', name: 'sent_at', nullable: true })
  sentAt: Date | null;
}
