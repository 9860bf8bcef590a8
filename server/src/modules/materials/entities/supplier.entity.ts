import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

@Index('supplier_name', ['name'], { unique: true })
@Entity({ name: 'supplier' })
export class Supplier {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'varchar', length: 200 })
  name: string;

  @Column({ type: 'varchar', length: 100 })
  country: string;

  @Column({ type: 'enum', enum: ['approved', 'conditional', 'disqualified'] })
  approval: 'approved' | 'conditional' | 'disqualified';

  @Column({ type: 'datetime', name: 'created_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  createdAt: Date;
}
