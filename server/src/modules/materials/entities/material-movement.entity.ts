import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { BarPiece } from './bar-piece.entity';
import { Person } from '../../people/entities/person.entity';
import { ProductionLot } from '../../manufacturing/entities/production-lot.entity';

@Entity({ name: 'material_movement' })
export class MaterialMovement {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'int', name: 'lot_id', unsigned: true })
  lotId: number;

  @Column({ type: 'int', name: 'bar_piece_id', unsigned: true })
  barPieceId: number;

  @Column({ type: 'enum', enum: ['issue', 'return'] })
  kind: 'issue' | 'return';

  @Column({ type: 'decimal', name: 'length_mm', precision: 10, scale: 2 })
  lengthMm: string;

  @Column({ type: 'int', name: 'recorded_by', unsigned: true })
  recordedBy: number;

  @Column({ type: 'datetime', name: 'recorded_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  recordedAt: Date;

  @ManyToOne(() => ProductionLot, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'lot_id', foreignKeyConstraintName: 'material_movement_lot' })
  lot?: Relation<ProductionLot>;

  @ManyToOne(() => BarPiece, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'bar_piece_id', foreignKeyConstraintName: 'material_movement_piece' })
  barPiece?: Relation<BarPiece>;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'recorded_by', foreignKeyConstraintName: 'material_movement_recorded_by' })
  recordedByPerson?: Relation<Person>;
}
