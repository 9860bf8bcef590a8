import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Heat } from './heat.entity';
import { Person } from '../../people/entities/person.entity';

@Index('screening_acknowledgement_finding', ['heatId', 'findingKey'], { unique: true })
@Entity({ name: 'screening_acknowledgement' })
export class ScreeningAcknowledgement {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'int', name: 'heat_id', unsigned: true })
  heatId: number;

  @Column({ type: 'varchar', name: 'finding_key', length: 160, charset: 'ascii' })
  findingKey: string;

  @Column({ type: 'varchar', length: 40, charset: 'ascii' })
  kind: string;

  @Column({ type: 'text' })
  explanation: string;

  @Column({ type: 'varchar', length: 1000 })
  reason: string;

  @Column({ type: 'int', name: 'acknowledged_by', unsigned: true })
  acknowledgedBy: number;

  @Column({ type: 'datetime', name: 'acknowledged_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  acknowledgedAt: Date;

  @ManyToOne(() => Heat, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'heat_id', foreignKeyConstraintName: 'screening_acknowledgement_heat' })
  heat?: Relation<Heat>;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'acknowledged_by', foreignKeyConstraintName: 'screening_acknowledgement_person' })
  acknowledgedByPerson?: Relation<Person>;
}
