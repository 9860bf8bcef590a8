import { Column, Entity, JoinColumn, ManyToOne, PrimaryColumn, type Relation } from 'typeorm';
import { Person } from '../../people/entities/person.entity';

@Entity({ name: 'reauthentication' })
export class Reauthentication {
  @PrimaryColumn({ type: 'char', length: 32, charset: 'ascii' })
  id: string;

  @Column({ type: 'int', name: 'person_id', unsigned: true })
  personId: number;

  @Column({ type: 'varchar', length: 300 })
  purpose: string;

  @Column({ type: 'char', name: 'binding_hash', length: 64, charset: 'ascii' })
  bindingHash: string;

  @Column({ type: 'varchar', name: 'return_to', length: 500 })
  returnTo: string;

  @Column({ type: 'datetime', name: 'started_at', precision: 6 })
  startedAt: Date;

  @Column({ type: 'datetime', name: 'confirmed_at', precision: 6, nullable: true })
  confirmedAt: Date | null;

  @Column({ type: 'datetime', name: 'authn_instant', precision: 6, nullable: true })
  authnInstant: Date | null;

  @Column({ type: 'varchar', name: 'refused_reason', length: 300, nullable: true })
  refusedReason: string | null;

  @Column({ type: 'datetime', name: 'used_at', precision: 6, nullable: true })
  usedAt: Date | null;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'person_id', foreignKeyConstraintName: 'reauthentication_person' })
  person?: Relation<Person>;
}
