import { Column, Entity, PrimaryColumn } from 'typeorm';

@Entity({ name: 'specification_revision' })
export class SpecificationRevision {
  @PrimaryColumn({ type: 'varchar', name: 'spec_id', length: 40 })
  specId: string;

  @PrimaryColumn({ type: 'varchar', length: 20 })
  revision: string;

  @Column({ type: 'varchar', length: 300 })
  title: string;

  @Column({ type: 'varchar', length: 200 })
  edition: string;

  @Column({ type: 'longtext', name: 'definition_json' })
  definitionJson: string;

  @Column({ type: 'char', name: 'definition_hash', length: 64, charset: 'ascii' })
  definitionHash: string;

  @Column({ type: 'datetime', name: 'created_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  createdAt: Date;
}
