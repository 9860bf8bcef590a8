import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Person } from '../../people/entities/person.entity';

@Index('recall_investigation_number', ['recallNumber'], { unique: true })
@Index('recall_investigation_status', ['status', 'openedAt'])
@Entity({ name: 'recall_investigation' })
export class RecallInvestigation {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'varchar', name: 'recall_number', length: 20 })
  recallNumber: string;

  @Column({ type: 'enum', enum: ['recall', 'drill'] })
  mode: 'recall' | 'drill';

  @Column({ type: 'enum', name: 'trigger_kind', enum: ['heat', 'piece', 'run', 'supplier', 'part'] })
  triggerKind: 'heat' | 'piece' | 'run' | 'supplier' | 'part';

  @Column({ type: 'int', name: 'trigger_id', unsigned: true })
  triggerId: number;

  @Column({ type: 'date', name: 'window_from', nullable: true })
  windowFrom: string | null;

  @Column({ type: 'date', name: 'window_to', nullable: true })
  windowTo: string | null;

  @Column({ type: 'varchar', name: 'trigger_label', length: 300 })
  triggerLabel: string;

  @Column({ type: 'varchar', length: 2000 })
  reason: string;

  @Column({ type: 'enum', enum: ['open', 'closed'], default: 'open' })
  status: 'open' | 'closed';

  @Column({ type: 'int', name: 'opened_by', unsigned: true })
  openedBy: number;

  @Column({ type: 'datetime', name: 'opened_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  openedAt: Date;

  @Column({ type: 'datetime', name: 'closed_at', precision: 6, nullable: true })
  closedAt: Date | null;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'opened_by', foreignKeyConstraintName: 'recall_investigation_opened_by' })
  openedByPerson?: Relation<Person>;
}
