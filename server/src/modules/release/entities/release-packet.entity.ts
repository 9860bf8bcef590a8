import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { ProductionLot } from '../../manufacturing/entities/production-lot.entity';
import { ReleaseSubmission } from './release-submission.entity';

@Index('release_packet_one_per_submission', ['submissionId'], { unique: true })
@Entity({ name: 'release_packet' })
export class ReleasePacket {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'int', name: 'lot_id', unsigned: true })
  lotId: number;

  @Column({ type: 'int', name: 'submission_id', unsigned: true })
  submissionId: number;

  @Column({ type: 'char', length: 64, charset: 'ascii' })
  sha256: string;

  @Column({ type: 'longblob' })
  content: Buffer;

  @Column({ type: 'datetime', name: 'created_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  createdAt: Date;

  @ManyToOne(() => ProductionLot, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'lot_id', foreignKeyConstraintName: 'release_packet_lot' })
  lot?: Relation<ProductionLot>;

  @ManyToOne(() => ReleaseSubmission, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'submission_id', foreignKeyConstraintName: 'release_packet_submission' })
  submission?: Relation<ReleaseSubmission>;
}
