import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { RecallNotice } from './recall-notice.entity';

@Index('notice_reply_of_notice', ['noticeId', 'id'])
@Entity({ name: 'notice_reply' })
export class NoticeReply {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'int', name: 'notice_id', unsigned: true })
  noticeId: number;

  @Column({ type: 'varchar', name: 'contact_name', length: 200 })
  contactName: string;

  @Column({ type: 'datetime', name: 'replied_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  repliedAt: Date;

  @Column({ type: 'varchar', name: 'client_address', length: 64, nullable: true })
  clientAddress: string | null;

  @ManyToOne(() => RecallNotice, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'notice_id', foreignKeyConstraintName: 'notice_reply_notice' })
  notice?: Relation<RecallNotice>;
}
