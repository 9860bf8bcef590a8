import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Person } from '../../people/entities/person.entity';

@Index('process_method_validation_scope', ['methodId', 'materialFamily', 'id'])
@Entity({ name: 'process_method_validation' })
export class ProcessMethodValidation {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'varchar', name: 'method_id', length: 40, charset: 'ascii' })
  methodId: string;

  @Column({ type: 'varchar', name: 'material_family', length: 40, charset: 'ascii' })
  materialFamily: string;

  @Column({ type: 'boolean' })
  stands: boolean;

  @Column({ type: 'varchar', length: 120 })
  reference: string;

  @Column({ type: 'varchar', length: 1000 })
  reason: string;

  @Column({ type: 'int', name: 'recorded_by', unsigned: true })
  recordedBy: number;

  @Column({ type: 'datetime', name: 'recorded_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  recordedAt: Date;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'recorded_by', foreignKeyConstraintName: 'process_method_validation_person' })
  recordedByPerson?: Relation<Person>;
}
