import { Column, Entity, JoinColumn, ManyToOne, PrimaryColumn, type Relation } from 'typeorm';
import { Heat } from './heat.entity';

@Entity({ name: 'heat_result' })
export class HeatResult {
  @PrimaryColumn({ type: 'int', name: 'heat_id', unsigned: true })
  heatId: number;

  @PrimaryColumn({ type: 'enum', enum: ['chemistry', 'mechanical'] })
  kind: 'chemistry' | 'mechanical';

  @PrimaryColumn({ type: 'varchar', length: 40 })
  item: string;

  @Column({ type: 'varchar', name: 'as_reported', length: 40 })
  asReported: string;

  @Column({ type: 'decimal', precision: 16, scale: 6 })
  value: string;

  @ManyToOne(() => Heat, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'heat_id', foreignKeyConstraintName: 'heat_result_heat' })
  heat?: Relation<Heat>;
}
