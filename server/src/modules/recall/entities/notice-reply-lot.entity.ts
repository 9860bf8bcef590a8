import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryColumn, type Relation } from 'typeorm';
import { NoticeReply } from './notice-reply.entity';
import { ProductionLot } from '../../manufacturing/entities/production-lot.entity';

@Index('notice_reply_lot_of_lot', ['lotId'])
@Entity({ name: 'notice_reply_lot' })
export class NoticeReplyLot {
  @PrimaryColumn({ type: 'int', name: 'reply_id', unsigned: true })
  replyId: number;

  @PrimaryColumn({ type: 'int', name: 'lot_id', unsigned: true })
  lotId: number;

  @Column({ type: 'int', name: 'on_hand', unsigned: true })
  onHand: number;

  @Column({ type: 'int', unsigned: true })
  returned: number;

  @Column({ type: 'int', unsigned: true })
  destroyed: number;

  @Column({ type: 'int', unsigned: true })
  used: number;

  @ManyToOne(() => ProductionLot, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'lot_id', foreignKeyConstraintName: 'notice_reply_lot_lot' })
  lot?: Relation<ProductionLot>;

  @ManyToOne(() => NoticeReply, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'reply_id', foreignKeyConstraintName: 'notice_reply_lot_reply' })
  reply?: Relation<NoticeReply>;
}
