import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Person } from '../../people/entities/person.entity';
import { SpecificationRevision } from './specification-revision.entity';

@Index('specification_draft_spec', ['specId'])
@Entity({ name: 'specification_draft' })
export class SpecificationDraft {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'varchar', name: 'spec_id', length: 40 })
  specId: string;

  @Column({ type: 'varchar', name: 'base_revision', length: 20 })
  baseRevision: string;

  @Column({ type: 'varchar', length: 20 })
  revision: string;

  @Column({ type: 'longtext', name: 'definition_json' })
  definitionJson: string;

  @Column({ type: 'varchar', length: 1000 })
  note: string;

  @Column({ type: 'enum', enum: ['draft', 'approved', 'rejected'], default: 'draft' })
  status: 'draft' | 'approved' | 'rejected';

  @Column({ type: 'int', name: 'created_by', unsigned: true })
  createdBy: number;

  @Column({ type: 'datetime', name: 'created_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  createdAt: Date;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'created_by', foreignKeyConstraintName: 'specification_draft_author' })
  createdByPerson?: Relation<Person>;

  @ManyToOne(() => SpecificationRevision, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn([
    { name: 'spec_id', referencedColumnName: 'specId', foreignKeyConstraintName: 'specification_draft_base' },
    { name: 'base_revision', referencedColumnName: 'revision', foreignKeyConstraintName: 'specification_draft_base' },
  ])
  base?: Relation<SpecificationRevision>;
}
