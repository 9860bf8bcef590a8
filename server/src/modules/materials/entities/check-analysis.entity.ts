import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Heat } from './heat.entity';
import { Person } from '../../people/entities/person.entity';

@Index('check_analysis_heat_order', ['heatId', 'id'])
@Entity({ name: 'check_analysis' })
export class CheckAnalysis {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'int', name: 'heat_id', unsigned: true })
  heatId: number;

  @Column({ type: 'varchar', length: 160 })
  laboratory: string;

  @Column({ type: 'varchar', name: 'report_reference', length: 80 })
  reportReference: string;

  @Column({ type: 'text', name: 'results_json' })
  resultsJson: string;

  @Column({ type: 'text', name: 'evaluation_json' })
  evaluationJson: string;

  @Column({ type: 'varchar', length: 20, charset: 'ascii' })
  verdict: string;

  @Column({ type: 'int', name: 'recorded_by', unsigned: true })
  recordedBy: number;

  @Column({ type: 'datetime', name: 'recorded_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  recordedAt: Date;

  @ManyToOne(() => Heat, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'heat_id', foreignKeyConstraintName: 'check_analysis_heat' })
  heat?: Relation<Heat>;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'recorded_by', foreignKeyConstraintName: 'check_analysis_person' })
  recordedByPerson?: Relation<Person>;
}
