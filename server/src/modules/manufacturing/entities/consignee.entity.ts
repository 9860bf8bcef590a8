import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

@Index('consignee_name', ['name'], { unique: true })
@Entity({ name: 'consignee' })
export class Consignee {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'varchar', length: 200 })
  name: string;

  @Column({ type: 'enum', enum: ['customer', 'distributor', 'hospital'] })
  kind: 'customer' | 'distributor' | 'hospital';

  @Column({ type: 'varchar', length: 80 })
  country: string;

  @Column({ type: 'varchar', name: 'contact_email', length: 200, nullable: true })
  contactEmail: string | null;
}
