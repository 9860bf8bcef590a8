import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Person } from '../../people/entities/person.entity';
import { RecallInvestigation } from './recall-investigation.entity';

@Index('recall_snapshot_recall_order', ['recallId', 'id'])
@Entity({ name: 'recall_snapshot' })
export class RecallSnapshot {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'int', name: 'recall_id', unsigned: true })
  recallId: number;

  @Column({ type: 'enum', enum: ['opening', 'rerun'] })
  kind: 'opening' | 'rerun';

  @Column({ type: 'int', name: 'taken_by', unsigned: true })
  takenBy: number;

  @Column({ type: 'datetime', name: 'taken_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  takenAt: Date;

  @Column({ type: 'longtext' })
  content: string;

  @Column({ type: 'char', length: 64, charset: 'ascii' })
  sha256: string;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'taken_by', foreignKeyConstraintName: 'recall_snapshot_by' })
  takenByPerson?: Relation<Person>;

  @ManyToOne(() => RecallInvestigation, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'recall_id', foreignKeyConstraintName: 'recall_snapshot_recall' })
  recall?: Relation<RecallInvestigation>;
}
