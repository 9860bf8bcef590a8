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

  @Column({ type: 'varchar', name: 'gs1_company_prefix', length: 12, nullable: true })
  gs1CompanyPrefix: string | null;

  @Column({ type: 'datetime', name: 'created_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  createdAt: Date;

  @Column({ type: 'boolean', name: 'administrators_may_approve', default: false })
  administratorsMayApprove: boolean;

  /** IANA name of the plant's time zone; every date and time people read is on its clock. */
  @Column({ type: 'varchar', name: 'time_zone', length: 64, charset: 'ascii', default: 'UTC' })
  timeZone: string;
}
