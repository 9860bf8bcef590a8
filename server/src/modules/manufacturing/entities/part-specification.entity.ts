import { Entity, JoinColumn, ManyToOne, PrimaryColumn, type Relation } from 'typeorm';
import { Part } from './part.entity';

@Entity({ name: 'part_specification' })
export class PartSpecification {
  @PrimaryColumn({ type: 'int', name: 'part_id', unsigned: true })
  partId: number;

  @PrimaryColumn({ type: 'varchar', name: 'spec_id', length: 40 })
  specId: string;

  @PrimaryColumn({ type: 'varchar', length: 20, default: '' })
  grade: string;

  @ManyToOne(() => Part, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'part_id', foreignKeyConstraintName: 'part_specification_part' })
  part?: Relation<Part>;
}
