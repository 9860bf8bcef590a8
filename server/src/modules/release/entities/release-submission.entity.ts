import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Person } from '../../people/entities/person.entity';
import { ProductionLot } from '../../manufacturing/entities/production-lot.entity';

@Index('release_submission_lot_submitted', ['lotId', 'submittedAt'])
@Index('release_submission_outcome', ['outcome', 'submittedAt'])
@Entity({ name: 'release_submission' })
export class ReleaseSubmission {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'int', name: 'lot_id', unsigned: true })
  lotId: number;

  @Column({ type: 'int', name: 'submitted_by', unsigned: true })
  submittedBy: number;

  @Column({ type: 'datetime', name: 'submitted_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  submittedAt: Date;

  @Column({ type: 'char', name: 'dossier_hash', length: 64, charset: 'ascii' })
  dossierHash: string;

  @Column({ type: 'enum', enum: ['pending', 'released', 'returned'], default: 'pending' })
  outcome: 'pending' | 'released' | 'returned';

  @Column({ type: 'datetime', name: 'closed_at', precision: 6, nullable: true })
  closedAt: Date | null;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'submitted_by', foreignKeyConstraintName: 'release_submission_by' })
  submittedByPerson?: Relation<Person>;

  @ManyToOne(() => ProductionLot, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'lot_id', foreignKeyConstraintName: 'release_submission_lot' })
  lot?: Relation<ProductionLot>;
}
