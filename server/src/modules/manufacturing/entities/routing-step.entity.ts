import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Part } from './part.entity';

@Index('routing_step_order', ['partId', 'stepNo'], { unique: true })
@Entity({ name: 'routing_step' })
export class RoutingStep {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'int', name: 'part_id', unsigned: true })
  partId: number;

  @Column({ type: 'smallint', name: 'step_no', unsigned: true })
  stepNo: number;

  @Column({ type: 'enum', enum: ['machining', 'passivation', 'cleaning', 'inspection', 'packaging'] })
  kind: 'machining' | 'passivation' | 'cleaning' | 'inspection' | 'packaging';

  @Column({ type: 'varchar', length: 100 })
  name: string;

  @Column({ type: 'varchar', name: 'process_method', length: 40, nullable: true })
  processMethod: string | null;

  @Column({ type: 'int', name: 'sample_size', unsigned: true, nullable: true })
  sampleSize: number | null;

  @Column({ type: 'int', name: 'accept_number', unsigned: true, nullable: true })
  acceptNumber: number | null;

  @Column({ type: 'int', name: 'reject_number', unsigned: true, nullable: true })
  rejectNumber: number | null;

  @ManyToOne(() => Part, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'part_id', foreignKeyConstraintName: 'routing_step_part' })
  part?: Relation<Part>;
}
