import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

@Index('certificate_document_sha256', ['sha256'], { unique: true })
@Entity({ name: 'certificate_document' })
export class CertificateDocument {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'char', length: 64, charset: 'ascii' })
  sha256: string;

  @Column({ type: 'varchar', name: 'media_type', length: 60 })
  mediaType: string;

  @Column({ type: 'int', name: 'size_bytes', unsigned: true })
  sizeBytes: number;

  @Column({ type: 'varchar', name: 'original_name', length: 255 })
  originalName: string;

  @Column({ type: 'longblob' })
  content: Buffer;

  @Column({ type: 'int', name: 'uploaded_by', unsigned: true })
  uploadedBy: number;

  @Column({ type: 'datetime', name: 'uploaded_at', precision: 6, default: () => 'CURRENT_TIMESTAMP(6)' })
  uploadedAt: Date;
}
