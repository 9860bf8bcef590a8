import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

@Index('saml_assertion_used_expires', ['expiresAt'])
@Entity({ name: 'saml_assertion_used' })
export class SamlAssertionUsed {
  @PrimaryColumn({ type: 'varchar', name: 'assertion_id', length: 255, charset: 'ascii' })
  assertionId: string;

  @Column({ type: 'datetime', name: 'used_at', precision: 6 })
  usedAt: Date;

  @Column({ type: 'datetime', name: 'expires_at', precision: 6 })
  expiresAt: Date;
}
