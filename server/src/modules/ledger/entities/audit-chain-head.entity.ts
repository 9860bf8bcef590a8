import { Column, Entity, PrimaryColumn } from 'typeorm';

@Entity({ name: 'audit_chain_head' })
export class AuditChainHead {
  @PrimaryColumn({ type: 'tinyint', unsigned: true })
  id: number;

  @Column({ type: 'bigint', unsigned: true })
  seq: string;

  @Column({ type: 'char', length: 64, charset: 'ascii' })
  hash: string;

  @Column({ type: 'boolean', default: false })
  signed: boolean;
}
