import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Person } from '../../people/entities/person.entity';

@Index('part_gtin', ['gtin'], { unique: true })
@Index('part_number_revision', ['partNumber', 'revision'], { unique: true })
@Entity({ name: 'part' })
export class Part {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'varchar', name: 'part_number', length: 40 })
  partNumber: string;

  @Column({ type: 'varchar', length: 10 })
  revision: string;

  @Column({ type: 'varchar', length: 200 })
  description: string;

  @Column({ type: 'char', length: 14, charset: 'ascii' })
  gtin: string;

  @Column({ type: 'decimal', name: 'unit_length_mm', precision: 10, scale: 2 })
  unitLengthMm: string;

  @Column({ type: 'decimal', name: 'cutoff_allowance_mm', precision: 10, scale: 2 })
  cutoffAllowanceMm: string;

  @Column({ type: 'decimal', name: 'unit_mass_g', precision: 10, scale: 3, nullable: true })
  unitMassG: string | null;

  @Column({ type: 'decimal', name: 'reconciliation_tolerance_pct', precision: 5, scale: 2 })
  reconciliationTolerancePct: string;

  @Column({ type: 'varchar', name: 'lot_pattern', length: 60 })
  lotPattern: string;

  @Column({
    type: 'enum',
    name: 'contact_category',
    enum: ['general-tissue', 'cerebrospinal-fluid'],
    default: 'general-tissue',
  })
  contactCategory: 'general-tissue' | 'cerebrospinal-fluid';

  @Column({ type: 'int', name: 'created_by', unsigned: true })
  createdBy: number;

  @Column({ type: 'datetime', name: 'created_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  createdAt: Date;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'created_by', foreignKeyConstraintName: 'part_created_by' })
  createdByPerson?: Relation<Person>;
}
