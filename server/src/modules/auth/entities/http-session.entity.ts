import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

@Index('http_session_expires', ['expires'])
@Entity({ name: 'http_session' })
export class HttpSession {
  @PrimaryColumn({ type: 'varchar', name: 'session_id', length: 128, charset: 'ascii', collation: 'ascii_bin' })
  sessionId: string;

  @Column({ type: 'int', unsigned: true })
  expires: number;

  @Column({ type: 'mediumtext', collation: 'utf8mb4_bin', nullable: true })
  data: string | null;
}
