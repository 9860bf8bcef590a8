import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

@Index('audit_event_action', ['action'])
@Index('audit_event_actor', ['actorId'])
@Index('audit_event_entity', ['entityType', 'entityId'])
@Index('audit_event_time', ['occurredAt'])
@Entity({ name: 'audit_event' })
export class AuditEvent {
  @PrimaryColumn({ type: 'bigint', unsigned: true })
  seq: string;

  @Column({ type: 'datetime', name: 'occurred_at', precision: 6 })
  occurredAt: Date;

  @Column({ type: 'int', name: 'actor_id', unsigned: true, nullable: true })
  actorId: number | null;

  @Column({ type: 'varchar', name: 'actor_name', length: 200, nullable: true })
  actorName: string | null;

  @Column({ type: 'varchar', name: 'actor_role', length: 40, nullable: true })
  actorRole: string | null;

  @Column({ type: 'varchar', length: 60 })
  action: string;

  @Column({ type: 'varchar', name: 'entity_type', length: 60 })
  entityType: string;

  @Column({ type: 'varchar', name: 'entity_id', length: 100, nullable: true })
  entityId: string | null;

  @Column({ type: 'longtext', name: 'before_json', nullable: true })
  beforeJson: string | null;

  @Column({ type: 'longtext', name: 'after_json', nullable: true })
  afterJson: string | null;

  @Column({ type: 'varchar', length: 1000, nullable: true })
  reason: string | null;

  @Column({ type: 'varchar', name: 'request_id', length: 128, nullable: true })
  requestId: string | null;

  @Column({ type: 'varchar', name: 'client_address', length: 64, nullable: true })
  clientAddress: string | null;

  @Column({ type: 'char', name: 'previous_hash', length: 64, charset: 'ascii' })
  previousHash: string;

  @Column({ type: 'char', length: 64, charset: 'ascii' })
  hash: string;

  @Column({ type: 'varchar', length: 100, charset: 'ascii', nullable: true })
  signature: string | null;

  @Column({ type: 'char', name: 'key_id', length: 16, charset: 'ascii', nullable: true })
  keyId: string | null;
}
