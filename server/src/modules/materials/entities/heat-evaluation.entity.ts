import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Heat } from './heat.entity';
import { SpecificationRevision } from './specification-revision.entity';

@Entity({ name: 'heat_evaluation' })
export class HeatEvaluation {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'int', name: 'heat_id', unsigned: true })
  heatId: number;

  @Column({ type: 'varchar', name: 'spec_id', length: 40 })
  specId: string;

  @Column({ type: 'varchar', name: 'spec_revision', length: 20 })
  specRevision: string;

  @Column({ type: 'enum', enum: ['conforms', 'does-not-conform', 'incomplete', 'cannot-be-evaluated'] })
  verdict: 'conforms' | 'does-not-conform' | 'incomplete' | 'cannot-be-evaluated';

  @Column({ type: 'longtext', name: 'evaluation_json' })
  evaluationJson: string;

  @Column({ type: 'int', name: 'evaluated_by', unsigned: true })
  evaluatedBy: number;

  @Column({ type: 'datetime', name: 'evaluated_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  evaluatedAt: Date;

  @ManyToOne(() => Heat, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'heat_id', foreignKeyConstraintName: 'heat_evaluation_heat' })
  heat?: Relation<Heat>;

  @ManyToOne(() => SpecificationRevision, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn([
    { name: 'spec_id', referencedColumnName: 'specId', foreignKeyConstraintName: 'heat_evaluation_specification' },
    {
      name: 'spec_revision',
      referencedColumnName: 'revision',
      foreignKeyConstraintName: 'heat_evaluation_specification',
    },
  ])
  specification?: Relation<SpecificationRevision>;
}
