import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

@Index('electronic_signature_reauthentication', ['reauthenticationId'], { unique: true })
@Index('electronic_signature_record', ['recordType', 'recordId'])
@Index('electronic_signature_signer', ['signerId'])
@Entity({ name: 'electronic_signature' })
export class ElectronicSignature {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id: string;

  @Column({ type: 'varchar', name: 'record_type', length: 60 })
  recordType: string;

  @Column({ type: 'varchar', name: 'record_id', length: 100 })
  recordId: string;

  @Column({ type: 'varchar', length: 40 })
  meaning: string;

  @Column({ type: 'varchar', length: 1000, nullable: true })
  reason: string | null;

  @Column({ type: 'int', name: 'signer_id', unsigned: true })
  signerId: number;

  @Column({ type: 'varchar', name: 'signer_name', length: 200 })
  signerName: string;

  @Column({ type: 'varchar', name: 'signer_role', length: 40 })
  signerRole: string;

  @Column({ type: 'datetime', name: 'signed_at', precision: 6 })
  signedAt: Date;

  @Column({ type: 'varchar', name: 'signed_at_text', length: 200 })
  signedAtText: string;

  @Column({ type: 'char', name: 'content_hash', length: 64, charset: 'ascii' })
  contentHash: string;

  @Column({ type: 'longtext', name: 'content_json' })
  contentJson: string;

  @Column({ type: 'char', name: 'reauthentication_id', length: 32, charset: 'ascii' })
  reauthenticationId: string;

  @Column({ type: 'datetime', name: 'authn_instant', precision: 6 })
  authnInstant: Date;

  @Column({ type: 'bigint', name: 'withdraws_signature_id', unsigned: true, nullable: true })
  withdrawsSignatureId: string | null;

  @Column({ type: 'bigint', name: 'ledger_seq', unsigned: true })
  ledgerSeq: string;
}
