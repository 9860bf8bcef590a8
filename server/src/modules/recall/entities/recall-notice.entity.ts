import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Consignee } from '../../manufacturing/entities/consignee.entity';
import { Person } from '../../people/entities/person.entity';
import { RecallInvestigation } from './recall-investigation.entity';

@Index('recall_notice_consignee', ['recallId', 'consigneeId'], { unique: true })
@Index('recall_notice_of_consignee', ['consigneeId'])
@Index('recall_notice_token', ['replyToken'], { unique: true })
@Entity({ name: 'recall_notice' })
export class RecallNotice {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'int', name: 'recall_id', unsigned: true })
  recallId: number;

  @Column({ type: 'int', name: 'consignee_id', unsigned: true })
  consigneeId: number;

  @Column({ type: 'char', name: 'reply_token', length: 43, charset: 'ascii', collation: 'ascii_bin' })
  replyToken: string;

  @Column({ type: 'varchar', length: 200, nullable: true })
  recipient: string | null;

  @Column({ type: 'longtext' })
  content: string;

  @Column({ type: 'char', length: 64, charset: 'ascii' })
  sha256: string;

  @Column({ type: 'int', name: 'prepared_by', unsigned: true })
  preparedBy: number;

  @Column({ type: 'datetime', name: 'prepared_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  preparedAt: Date;

  @Column({ type: 'datetime', name: 'issued_at', precision: 6, nullable: true })
  issuedAt: Date | null;

  @Column({ type: 'tinyint', name: 'reminders_sent', unsigned: true, default: () => '0' })
  remindersSent: number;

  @Column({ type: 'datetime', name: 'last_reminder_at', precision: 6, nullable: true })
  lastReminderAt: Date | null;

  @Column({ type: 'datetime', name: 'escalated_at', precision: 6, nullable: true })
  escalatedAt: Date | null;

  @ManyToOne(() => Consignee, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'consignee_id', foreignKeyConstraintName: 'recall_notice_consignee_ref' })
  consignee?: Relation<Consignee>;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'prepared_by', foreignKeyConstraintName: 'recall_notice_prepared_by' })
  preparedByPerson?: Relation<Person>;

  @ManyToOne(() => RecallInvestigation, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'recall_id', foreignKeyConstraintName: 'recall_notice_recall' })
  recall?: Relation<RecallInvestigation>;
}
