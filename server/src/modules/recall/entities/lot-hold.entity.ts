import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Person } from '../../people/entities/person.entity';
import { ProductionLot } from '../../manufacturing/entities/production-lot.entity';
import { RecallInvestigation } from './recall-investigation.entity';

@Index('lot_hold_lot_lifted', ['lotId', 'liftedAt'])
@Entity({ name: 'lot_hold' })
export class LotHold {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'int', name: 'lot_id', unsigned: true })
  lotId: number;

  @Column({ type: 'int', name: 'recall_id', unsigned: true, nullable: true })
  recallId: number | null;

  @Column({ type: 'varchar', length: 2000 })
  reason: string;

  @Column({ type: 'int', name: 'placed_by', unsigned: true })
  placedBy: number;

  @Column({ type: 'datetime', name: 'placed_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  placedAt: Date;

  @Column({ type: 'datetime', name: 'lifted_at', precision: 6, nullable: true })
  liftedAt: Date | null;

  @Column({ type: 'int', name: 'lifted_by', unsigned: true, nullable: true })
  liftedBy: number | null;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT' })
  @JoinColumn({ name: 'lifted_by', foreignKeyConstraintName: 'lot_hold_lifted_by' })
  liftedByPerson?: Relation<Person> | null;

  @ManyToOne(() => ProductionLot, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'lot_id', foreignKeyConstraintName: 'lot_hold_lot' })
  lot?: Relation<ProductionLot>;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'placed_by', foreignKeyConstraintName: 'lot_hold_placed_by' })
  placedByPerson?: Relation<Person>;

  @ManyToOne(() => RecallInvestigation, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT' })
  @JoinColumn({ name: 'recall_id', foreignKeyConstraintName: 'lot_hold_recall' })
  recall?: Relation<RecallInvestigation> | null;
}
