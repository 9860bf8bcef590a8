import { Entity, JoinColumn, ManyToOne, PrimaryColumn, type Relation } from 'typeorm';
import { Person } from './person.entity';

@Entity({ name: 'person_role' })
export class PersonRole {
  @PrimaryColumn({ type: 'int', name: 'person_id', unsigned: true })
  personId: number;

  @PrimaryColumn({ type: 'varchar', length: 40 })
  role: string;

  @PrimaryColumn({ type: 'enum', enum: ['identity-provider', 'administrator'] })
  source: 'identity-provider' | 'administrator';

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'person_id', foreignKeyConstraintName: 'person_role_person' })
  person?: Relation<Person>;
}
