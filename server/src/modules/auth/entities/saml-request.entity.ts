import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

@Index('saml_request_created', ['createdAt'])
@Entity({ name: 'saml_request' })
export class SamlRequest {
  @PrimaryColumn({ type: 'varchar', length: 255, charset: 'ascii' })
  id: string;

  @Column({ type: 'text' })
  value: string;

  @Column({ type: 'datetime', name: 'created_at', precision: 6 })
  createdAt: Date;
}
