import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Consignee } from '../../manufacturing/entities/consignee.entity';
import { Person } from '../../people/entities/person.entity';
import { ProductionLot } from '../../manufacturing/entities/production-lot.entity';
import { RecallInvestigation } from './recall-investigation.entity';

@Index('returned_goods_of_consignee', ['consigneeId'])
@Index('returned_goods_of_lot', ['lotId'])
@Index('returned_goods_of_recall', ['recallId', 'consigneeId', 'lotId'])
@Entity({ name: 'returned_goods_receipt' })
export class ReturnedGoodsReceipt {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'int', name: 'recall_id', unsigned: true })
  recallId: number;

  @Column({ type: 'int', name: 'consignee_id', unsigned: true })
  consigneeId: number;

  @Column({ type: 'int', name: 'lot_id', unsigned: true })
  lotId: number;

  @Column({ type: 'int', unsigned: true })
  units: number;

  @Column({ type: 'varchar', length: 500, nullable: true })
  note: string | null;

  @Column({ type: 'int', name: 'received_by', unsigned: true })
  receivedBy: number;

  @Column({ type: 'datetime', name: 'received_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  receivedAt: Date;

  @ManyToOne(() => Consignee, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'consignee_id', foreignKeyConstraintName: 'returned_goods_consignee' })
  consignee?: Relation<Consignee>;

  @ManyToOne(() => ProductionLot, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'lot_id', foreignKeyConstraintName: 'returned_goods_lot' })
  lot?: Relation<ProductionLot>;

  @ManyToOne(() => RecallInvestigation, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'recall_id', foreignKeyConstraintName: 'returned_goods_recall' })
  recall?: Relation<RecallInvestigation>;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'received_by', foreignKeyConstraintName: 'returned_goods_received_by' })
  receivedByPerson?: Relation<Person>;
}
