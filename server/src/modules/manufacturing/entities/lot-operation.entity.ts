import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Person } from '../../people/entities/person.entity';
import { ProductionLot } from './production-lot.entity';
import { RoutingStep } from './routing-step.entity';

@Index('lot_operation_run', ['processRunId'])
@Index('lot_operation_step', ['lotId', 'routingStepId'], { unique: true })
@Entity({ name: 'lot_operation' })
export class LotOperation {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'int', name: 'lot_id', unsigned: true })
  lotId: number;

  @Column({ type: 'int', name: 'routing_step_id', unsigned: true })
  routingStepId: number;

  @Column({ type: 'varchar', name: 'operator_name', length: 200 })
  operatorName: string;

  @Column({ type: 'varchar', name: 'work_centre', length: 60 })
  workCentre: string;

  @Column({ type: 'varchar', name: 'program_revision', length: 60, nullable: true })
  programRevision: string | null;

  @Column({ type: 'datetime', name: 'started_at', precision: 6 })
  startedAt: Date;

  @Column({ type: 'datetime', name: 'ended_at', precision: 6 })
  endedAt: Date;

  @Column({ type: 'int', name: 'qty_in', unsigned: true })
  qtyIn: number;

  @Column({ type: 'int', name: 'qty_good', unsigned: true })
  qtyGood: number;

  @Column({ type: 'int', name: 'qty_scrap', unsigned: true })
  qtyScrap: number;

  @Column({ type: 'text', name: 'scrap_reasons' })
  scrapReasons: string;

  @Column({ type: 'int', name: 'sample_size', unsigned: true, nullable: true })
  sampleSize: number | null;

  @Column({ type: 'int', name: 'defects_found', unsigned: true, nullable: true })
  defectsFound: number | null;

  @Column({ type: 'enum', enum: ['accept', 'reject'], nullable: true })
  verdict: 'accept' | 'reject' | null;

  @Column({ type: 'int', name: 'process_run_id', unsigned: true, nullable: true })
  processRunId: number | null;

  @Column({ type: 'text', nullable: true })
  notes: string | null;

  @Column({ type: 'int', name: 'recorded_by', unsigned: true })
  recordedBy: number;

  @Column({ type: 'datetime', name: 'recorded_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  recordedAt: Date;

  @ManyToOne(() => ProductionLot, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'lot_id', foreignKeyConstraintName: 'lot_operation_lot' })
  lot?: Relation<ProductionLot>;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'recorded_by', foreignKeyConstraintName: 'lot_operation_recorded_by' })
  recordedByPerson?: Relation<Person>;

  @ManyToOne(() => RoutingStep, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'routing_step_id', foreignKeyConstraintName: 'lot_operation_routing_step' })
  routingStep?: Relation<RoutingStep>;
}
