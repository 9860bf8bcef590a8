import { Column, Entity, JoinColumn, ManyToOne, PrimaryColumn, type Relation } from 'typeorm';
import { CertificateDocument } from '../../materials/entities/certificate-document.entity';
import { LotOperation } from './lot-operation.entity';

@Entity({ name: 'operation_file' })
export class OperationFile {
  @PrimaryColumn({ type: 'int', name: 'operation_id', unsigned: true })
  operationId: number;

  @PrimaryColumn({ type: 'int', name: 'document_id', unsigned: true })
  documentId: number;

  @Column({ type: 'varchar', length: 200 })
  name: string;

  @Column({ type: 'int', name: 'attached_by', unsigned: true })
  attachedBy: number;

  @Column({ type: 'datetime', name: 'attached_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  attachedAt: Date;

  @ManyToOne(() => CertificateDocument, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'document_id', foreignKeyConstraintName: 'operation_file_document' })
  document?: Relation<CertificateDocument>;

  @ManyToOne(() => LotOperation, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'operation_id', foreignKeyConstraintName: 'operation_file_operation' })
  operation?: Relation<LotOperation>;
}
