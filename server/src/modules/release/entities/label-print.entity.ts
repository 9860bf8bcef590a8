import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Person } from '../../people/entities/person.entity';
import { ProductionLot } from '../../manufacturing/entities/production-lot.entity';

@Entity({ name: 'label_print' })
export class LabelPrint {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'int', name: 'lot_id', unsigned: true })
  lotId: number;

  @Column({ type: 'enum', enum: ['print', 'void'] })
  kind: 'print' | 'void';

  @Column({ type: 'int', unsigned: true })
  qty: number;

  @Column({ type: 'varchar', length: 500, nullable: true })
  reason: string | null;

  @Column({ type: 'int', name: 'recorded_by', unsigned: true })
  recordedBy: number;

  @Column({ type: 'datetime', name: 'recorded_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  recordedAt: Date;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'recorded_by', foreignKeyConstraintName: 'label_print_by' })
  recordedByPerson?: Relation<Person>;

  @ManyToOne(() => ProductionLot, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'lot_id', foreignKeyConstraintName: 'label_print_lot' })
  lot?: Relation<ProductionLot>;
}
