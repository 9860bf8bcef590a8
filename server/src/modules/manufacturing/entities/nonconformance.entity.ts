import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Person } from '../../people/entities/person.entity';

@Index('nonconformance_lot', ['lotId'])
@Index('nonconformance_number', ['ncNumber'], { unique: true })
@Index('nonconformance_status', ['status', 'raisedAt'])
@Index('nonconformance_subject', ['subjectType', 'subjectId'])
@Entity({ name: 'nonconformance' })
export class Nonconformance {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'varchar', name: 'nc_number', length: 20 })
  ncNumber: string;

  @Column({ type: 'enum', name: 'subject_type', enum: ['heat', 'bar-piece', 'lot', 'process-run'] })
  subjectType: 'heat' | 'bar-piece' | 'lot' | 'process-run';

  @Column({ type: 'int', name: 'subject_id', unsigned: true })
  subjectId: number;

  @Column({ type: 'int', name: 'lot_id', unsigned: true, nullable: true })
  lotId: number | null;

  @Column({ type: 'int', name: 'process_run_id', unsigned: true, nullable: true })
  processRunId: number | null;

  @Column({ type: 'enum', enum: ['raised', 'run-window'], default: 'raised' })
  source: 'raised' | 'run-window';

  @Column({ type: 'text' })
  description: string;

  @Column({ type: 'text' })
  containment: string;

  @Column({ type: 'enum', enum: ['open', 'dispositioned', 'closed'], default: 'open' })
  status: 'open' | 'dispositioned' | 'closed';

  @Column({ type: 'enum', enum: ['use-as-is', 'rework', 'scrap', 'return-to-supplier'], nullable: true })
  disposition: 'use-as-is' | 'rework' | 'scrap' | 'return-to-supplier' | null;

  @Column({ type: 'text', name: 'disposition_note', nullable: true })
  dispositionNote: string | null;

  @Column({ type: 'int', name: 'raised_by', unsigned: true })
  raisedBy: number;

  @Column({ type: 'datetime', name: 'raised_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  raisedAt: Date;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'raised_by', foreignKeyConstraintName: 'nonconformance_raised_by' })
  raisedByPerson?: Relation<Person>;
}
