import { Entity, JoinColumn, ManyToOne, PrimaryColumn, type Relation } from 'typeorm';
import { Heat } from '../../materials/entities/heat.entity';
import { ProductionLot } from './production-lot.entity';

@Entity({ name: 'lot_heat' })
export class LotHeat {
  @PrimaryColumn({ type: 'int', name: 'heat_id', unsigned: true })
  heatId: number;

  @PrimaryColumn({ type: 'int', name: 'lot_id', unsigned: true })
  lotId: number;

  @ManyToOne(() => Heat, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'heat_id', foreignKeyConstraintName: 'lot_heat_heat' })
  heat?: Relation<Heat>;

  @ManyToOne(() => ProductionLot, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'lot_id', foreignKeyConstraintName: 'lot_heat_lot' })
  lot?: Relation<ProductionLot>;
}
