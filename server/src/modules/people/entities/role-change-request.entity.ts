import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Person } from './person.entity';

@Index('role_change_request_person_status', ['personId', 'status'])
@Entity({ name: 'role_change_request' })
export class RoleChangeRequest {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'int', name: 'person_id', unsigned: true })
  personId: number;

  @Column({ type: 'varchar', name: 'roles_before', length: 300, charset: 'ascii' })
  rolesBefore: string;

  @Column({ type: 'varchar', name: 'roles_after', length: 300, charset: 'ascii' })
  rolesAfter: string;

  @Column({ type: 'varchar', length: 1000 })
  reason: string;

  @Column({ type: 'int', name: 'requested_by', unsigned: true })
  requestedBy: number;

  @Column({ type: 'datetime', name: 'requested_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  requestedAt: Date;

  @Column({ type: 'enum', enum: ['pending', 'confirmed', 'refused'], default: 'pending' })
  status: 'pending' | 'confirmed' | 'refused';

  @Column({ type: 'int', name: 'decided_by', unsigned: true, nullable: true })
  decidedBy: number | null;

  @Column({ type: 'datetime', name: 'decided_at', precision: 6, nullable: true })
  decidedAt: Date | null;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT' })
  @JoinColumn({ name: 'decided_by', foreignKeyConstraintName: 'role_change_request_decider' })
  decidedByPerson?: Relation<Person> | null;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'person_id', foreignKeyConstraintName: 'role_change_request_person' })
  person?: Relation<Person>;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'requested_by', foreignKeyConstraintName: 'role_change_request_requester' })
  requestedByPerson?: Relation<Person>;
}
