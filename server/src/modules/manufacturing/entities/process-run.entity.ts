import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Person } from '../../people/entities/person.entity';

@Index('process_run_at', ['runAt'])
@Index('process_run_number', ['runNumber'], { unique: true })
@Entity({ name: 'process_run' })
export class ProcessRun {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'varchar', name: 'run_number', length: 30 })
  runNumber: string;

  @Column({ type: 'enum', enum: ['passivation', 'cleaning'] })
  kind: 'passivation' | 'cleaning';

  @Column({ type: 'varchar', name: 'method_id', length: 40 })
  methodId: string;

  @Column({ type: 'varchar', length: 60 })
  equipment: string;

  @Column({ type: 'text', name: 'parameters_json' })
  parametersJson: string;

  @Column({ type: 'text', name: 'window_check_json' })
  windowCheckJson: string;

  @Column({ type: 'boolean', name: 'in_window' })
  inWindow: boolean;

  @Column({ type: 'varchar', name: 'operator_name', length: 200 })
  operatorName: string;

  @Column({ type: 'datetime', name: 'run_at', precision: 6 })
  runAt: Date;

  @Column({ type: 'int', name: 'recorded_by', unsigned: true })
  recordedBy: number;

  @Column({ type: 'datetime', name: 'recorded_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  recordedAt: Date;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'recorded_by', foreignKeyConstraintName: 'process_run_recorded_by' })
  recordedByPerson?: Relation<Person>;
}
