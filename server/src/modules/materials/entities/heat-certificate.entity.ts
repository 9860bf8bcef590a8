import { Column, Entity, JoinColumn, ManyToOne, PrimaryColumn, type Relation } from 'typeorm';
import { CertificateDocument } from './certificate-document.entity';
import { Heat } from './heat.entity';

@Entity({ name: 'heat_certificate' })
export class HeatCertificate {
  @PrimaryColumn({ type: 'int', name: 'heat_id', unsigned: true })
  heatId: number;

  @PrimaryColumn({ type: 'int', name: 'document_id', unsigned: true })
  documentId: number;

  @Column({ type: 'int', name: 'attached_by', unsigned: true })
  attachedBy: number;

  @Column({ type: 'datetime', name: 'attached_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  attachedAt: Date;

  @ManyToOne(() => CertificateDocument, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'document_id', foreignKeyConstraintName: 'heat_certificate_document' })
  document?: Relation<CertificateDocument>;

  @ManyToOne(() => Heat, { onDelete: 'RESTRICT', onUpdate: 'RESTRICT', nullable: false })
  @JoinColumn({ name: 'heat_id', foreignKeyConstraintName: 'heat_certificate_heat' })
  heat?: Relation<Heat>;
}
