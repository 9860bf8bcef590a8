import { Column, Entity, JoinColumn, ManyToOne, PrimaryColumn, type Relation } from 'typeorm';
import { Person } from '../../people/entities/person.entity';
import { RecallInvestigation } from './recall-investigation.entity';

@Entity({ name: 'recall_field_action' })
export class RecallFieldAction {
  @PrimaryColumn({ type: 'int', name: 'recall_id', unsigned: true })
  recallId: number;

  @Column({ type: 'enum', name: 'effectiveness_level', enum: ['A', 'B', 'C', 'D', 'E'] })
  effectivenessLevel: 'A' | 'B' | 'C' | 'D' | 'E';

  @Column({ type: 'tinyint', name: 'level_b_percent', unsigned: true, nullable: true })
  levelBPercent: number | null;

  @Column({ type: 'varchar', name: 'action_asked', length: 1000 })
  actionAsked: string;

  @Column({ type: 'text', name: 'notice_template' })
  noticeTemplate: string;

  @Column({ type: 'tinyint', name: 'reminder_every_days', unsigned: true })
  reminderEveryDays: number;

  @Column({ type: 'tinyint', name: 'escalate_after_reminders', unsigned: true })
  escalateAfterReminders: number;

  @Column({ type: 'int', name: 'set_by', unsigned: true })
  setBy: number;

  @Column({ type: 'datetime', name: 'set_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  setAt: Date;

  @ManyToOne(() => RecallInvestigation, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'recall_id', foreignKeyConstraintName: 'recall_field_action_recall' })
  recall?: Relation<RecallInvestigation>;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'set_by', foreignKeyConstraintName: 'recall_field_action_set_by' })
  setByPerson?: Relation<Person>;
}
