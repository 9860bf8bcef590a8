import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Consignee } from './consignee.entity';
import { Person } from '../../people/entities/person.entity';
import { ProductionLot } from './production-lot.entity';

@Index('shipment_consignee_shipped', ['consigneeId', 'shippedOn'])
@Entity({ name: 'shipment' })
export class Shipment {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'int', name: 'lot_id', unsigned: true })
  lotId: number;

  @Column({ type: 'int', name: 'consignee_id', unsigned: true })
  consigneeId: number;

  @Column({ type: 'int', unsigned: true })
  qty: number;

  @Column({ type: 'date', name: 'shipped_on' })
  shippedOn: string;

  @Column({ type: 'varchar', name: 'document_number', length: 40 })
  documentNumber: string;

  @Column({ type: 'int', name: 'recorded_by', unsigned: true })
  recordedBy: number;

  @Column({ type: 'datetime', name: 'recorded_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  recordedAt: Date;

  @ManyToOne(() => Consignee, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'consignee_id', foreignKeyConstraintName: 'shipment_consignee' })
  consignee?: Relation<Consignee>;

  @ManyToOne(() => ProductionLot, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'lot_id', foreignKeyConstraintName: 'shipment_lot' })
  lot?: Relation<ProductionLot>;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'recorded_by', foreignKeyConstraintName: 'shipment_recorded_by' })
  recordedByPerson?: Relation<Person>;
}
