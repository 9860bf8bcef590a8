import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Person } from '../../people/entities/person.entity';
import { Supplier } from './supplier.entity';

@Index('check_analysis_rule_scope', ['supplierId', 'specId', 'id'])
@Entity({ name: 'check_analysis_rule' })
export class CheckAnalysisRule {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'int', name: 'supplier_id', unsigned: true, nullable: true })
  supplierId: number | null;

  @Column({ type: 'varchar', name: 'spec_id', length: 40, nullable: true })
  specId: string | null;

  @Column({ type: 'smallint', name: 'every_nth_heat', unsigned: true, nullable: true })
  everyNthHeat: number | null;

  @Column({ type: 'boolean', name: 'every_heat_when_conditional' })
  everyHeatWhenConditional: boolean;

  @Column({ type: 'varchar', length: 1000 })
  reason: string;

  @Column({ type: 'int', name: 'set_by', unsigned: true })
  setBy: number;

  @Column({ type: 'datetime', name: 'set_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  setAt: Date;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'set_by', foreignKeyConstraintName: 'check_analysis_rule_person' })
  setByPerson?: Relation<Person>;

  @ManyToOne(() => Supplier, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT' })
  @JoinColumn({ name: 'supplier_id', foreignKeyConstraintName: 'check_analysis_rule_supplier' })
  supplier?: Relation<Supplier> | null;
}
