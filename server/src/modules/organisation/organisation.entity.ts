import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

@Entity({ name: 'organisation' })
export class Organisation {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'varchar', length: 200 })
  name: string;

  @Column({ type: 'varchar', length: 200 })
  site: string;

  @Column({ type: 'varchar', length: 500 })
  address: string;

  @Column({ type: 'varchar', length: 12, name: 'gs1_company_prefix', nullable: true })
  gs1CompanyPrefix: string | null;

  /** IANA name of the plant's time zone; every date and time people read is on its clock. */
  @Column({ type: 'varchar', length: 64, name: 'time_zone', charset: 'ascii', default: 'UTC' })
  timeZone: string;

  @Column({ type: 'datetime', precision: 6, name: 'created_at', default: () => 'CURRENT_TIMESTAMP(6)' })
  createdAt: Date;
}
