import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Person } from '../../people/entities/person.entity';
import { SpecificationRevision } from './specification-revision.entity';
import { Supplier } from './supplier.entity';

@Index('heat_received', ['receivedAt'])
@Index('heat_spec', ['specId', 'specRevision'])
@Index('heat_supplier_number', ['supplierId', 'heatNumber'], { unique: true })
@Entity({ name: 'heat' })
export class Heat {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'varchar', name: 'heat_number', length: 60 })
  heatNumber: string;

  @Column({ type: 'int', name: 'supplier_id', unsigned: true })
  supplierId: number;

  @Column({ type: 'varchar', name: 'spec_id', length: 40 })
  specId: string;

  @Column({ type: 'varchar', name: 'spec_revision', length: 20 })
  specRevision: string;

  @Column({ type: 'varchar', length: 20, nullable: true })
  grade: string | null;

  @Column({ type: 'varchar', name: 'melt_route', length: 100 })
  meltRoute: string;

  @Column({ type: 'varchar', name: 'product_form', length: 20 })
  productForm: string;

  @Column({ type: 'decimal', name: 'size_mm', precision: 9, scale: 3 })
  sizeMm: string;

  @Column({ type: 'varchar', name: 'heat_condition', length: 40 })
  heatCondition: string;

  @Column({ type: 'enum', enum: ['received', 'accepted', 'rejected', 'quarantined'], default: 'received' })
  status: 'received' | 'accepted' | 'rejected' | 'quarantined';

  @Column({ type: 'int', name: 'received_by', unsigned: true })
  receivedBy: number;

  @Column({ type: 'datetime', name: 'received_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  receivedAt: Date;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'received_by', foreignKeyConstraintName: 'heat_received_by' })
  receivedByPerson?: Relation<Person>;

  @ManyToOne(() => SpecificationRevision, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn([
    { name: 'spec_id', referencedColumnName: 'specId', foreignKeyConstraintName: 'heat_specification' },
    { name: 'spec_revision', referencedColumnName: 'revision', foreignKeyConstraintName: 'heat_specification' },
  ])
  specification?: Relation<SpecificationRevision>;

  @ManyToOne(() => Supplier, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'supplier_id', foreignKeyConstraintName: 'heat_supplier' })
  supplier?: Relation<Supplier>;
}
