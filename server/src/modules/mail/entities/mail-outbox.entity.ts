import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

@Index('mail_outbox_due', ['sentAt', 'nextAttemptAt'])
@Entity({ name: 'mail_outbox' })
export class MailOutbox {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'text' })
  recipients: string;

  @Column({ type: 'varchar', length: 300 })
  subject: string;

  @Column({ type: 'text', name: 'body_text' })
  bodyText: string;

  @Column({ type: 'varchar', length: 60 })
  event: string;

  @Column({ type: 'varchar', name: 'entity_type', length: 60 })
  entityType: string;

  @Column({ type: 'varchar', name: 'entity_id', length: 100 })
  entityId: string;

  @Column({ type: 'datetime', name: 'created_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  createdAt: Date;

  @Column({ type: 'int', unsigned: true, default: () => '0' })
  attempts: number;

  @Column({ type: 'datetime', name: 'next_attempt_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  nextAttemptAt: Date;

  @Column({ type: 'datetime', name: 'sent_at', precision: 6, nullable: true })
  sentAt: Date | null;

  @Column({ type: 'varchar', name: 'last_error', length: 1000, nullable: true })
  lastError: string | null;

  @Column({ type: 'varchar', name: 'attachment_name', length: 200, nullable: true })
  attachmentName: string | null;

  @Column({ type: 'varchar', name: 'attachment_type', length: 100, nullable: true })
  attachmentType: string | null;

  @Column({ type: 'longblob', nullable: true })
  attachment: Buffer | null;
}
