import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

@Index('person_name', ['name'])
@Index('person_subject', ['subject'], { unique: true })
@Entity({ name: 'person' })
export class Person {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'varchar', length: 255 })
  subject: string;

  @Column({ type: 'varchar', length: 200 })
  name: string;

  @Column({ type: 'varchar', length: 320 })
  email: string;

  @Column({ type: 'boolean', default: true })
  active: boolean;

  @Column({ type: 'datetime', name: 'created_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  createdAt: Date;

  @Column({ type: 'datetime', name: 'last_sign_in_at', precision: 6, nullable: true })
  lastSignInAt: Date | null;
}
