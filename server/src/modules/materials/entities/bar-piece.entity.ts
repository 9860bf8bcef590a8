import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Heat } from './heat.entity';
import { Person } from '../../people/entities/person.entity';

@Index('bar_piece_tag', ['tag'], { unique: true })
@Entity({ name: 'bar_piece' })
export class BarPiece {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'varchar', length: 40 })
  tag: string;

  @Column({ type: 'int', name: 'heat_id', unsigned: true })
  heatId: number;

  @Column({ type: 'varchar', name: 'marked_heat_number', length: 60, nullable: true })
  markedHeatNumber: string | null;

  @Column({ type: 'int', name: 'parent_id', unsigned: true, nullable: true })
  parentId: number | null;

  @Column({ type: 'decimal', name: 'diameter_mm', precision: 9, scale: 3 })
  diameterMm: string;

  @Column({ type: 'decimal', name: 'length_mm', precision: 10, scale: 2 })
  lengthMm: string;

  @Column({ type: 'decimal', name: 'mass_kg', precision: 10, scale: 3, nullable: true })
  massKg: string | null;

  @Column({ type: 'varchar', length: 100 })
  location: string;

  @Column({ type: 'enum', enum: ['in-stock', 'cut'], default: 'in-stock' })
  status: 'in-stock' | 'cut';

  @Column({ type: 'int', name: 'created_by', unsigned: true })
  createdBy: number;

  @Column({ type: 'datetime', name: 'created_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  createdAt: Date;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'created_by', foreignKeyConstraintName: 'bar_piece_created_by' })
  createdByPerson?: Relation<Person>;

  @ManyToOne(() => Heat, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'heat_id', foreignKeyConstraintName: 'bar_piece_heat' })
  heat?: Relation<Heat>;

  @ManyToOne(() => BarPiece, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT' })
  @JoinColumn({ name: 'parent_id', foreignKeyConstraintName: 'bar_piece_parent' })
  parent?: Relation<BarPiece> | null;
}
