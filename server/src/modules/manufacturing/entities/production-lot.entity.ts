import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { LotStatus } from '@shared/domain/manufacturing/lot-status';
import { Part } from './part.entity';
import { Person } from '../../people/entities/person.entity';

@Index('production_lot_number', ['lotNumber'], { unique: true })
@Index('production_lot_opened', ['openedAt'])
@Index('production_lot_part_opened', ['partId', 'openedAt'])
@Index('production_lot_status', ['status', 'openedAt'])
@Entity({ name: 'production_lot' })
export class ProductionLot {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'varchar', name: 'lot_number', length: 20, charset: 'ascii', collation: 'ascii_bin' })
  lotNumber: string;

  @Column({ type: 'int', name: 'part_id', unsigned: true })
  partId: number;

  @Column({ type: 'int', name: 'planned_qty', unsigned: true })
  plannedQty: number;

  @Column({ type: 'int', name: 'start_qty', unsigned: true, nullable: true })
  startQty: number | null;

  @Column({ type: 'enum', enum: ['bar', 'split', 'merge'], default: 'bar' })
  origin: 'bar' | 'split' | 'merge';

  @Column({ type: 'smallint', name: 'resumes_after_step', unsigned: true, default: () => '0' })
  resumesAfterStep: number;

  @Column({ type: 'varchar', length: 20, default: 'open' })
  status: LotStatus;

  @Column({ type: 'int', name: 'released_qty', unsigned: true, default: () => '0' })
  releasedQty: number;

  @Column({ type: 'int', name: 'opened_by', unsigned: true })
  openedBy: number;

  @Column({ type: 'datetime', name: 'opened_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  openedAt: Date;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'opened_by', foreignKeyConstraintName: 'production_lot_opened_by' })
  openedByPerson?: Relation<Person>;

  @ManyToOne(() => Part, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'part_id', foreignKeyConstraintName: 'production_lot_part' })
  part?: Relation<Part>;
}
