import { Column, Entity, JoinColumn, ManyToOne, PrimaryColumn, type Relation } from 'typeorm';
import { ProductionLot } from './production-lot.entity';

@Entity({ name: 'lot_link' })
export class LotLink {
  @PrimaryColumn({ type: 'int', name: 'parent_lot_id', unsigned: true })
  parentLotId: number;

  @PrimaryColumn({ type: 'int', name: 'child_lot_id', unsigned: true })
  childLotId: number;

  @Column({ type: 'enum', enum: ['split', 'merge'] })
  kind: 'split' | 'merge';

  @Column({ type: 'int', unsigned: true })
  qty: number;

  @Column({ type: 'smallint', name: 'after_step', unsigned: true })
  afterStep: number;

  @Column({ type: 'int', name: 'recorded_by', unsigned: true })
  recordedBy: number;

  @Column({ type: 'datetime', name: 'recorded_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  recordedAt: Date;

  @ManyToOne(() => ProductionLot, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'child_lot_id', foreignKeyConstraintName: 'lot_link_child' })
  childLot?: Relation<ProductionLot>;

  @ManyToOne(() => ProductionLot, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'parent_lot_id', foreignKeyConstraintName: 'lot_link_parent' })
  parentLot?: Relation<ProductionLot>;
}
