import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

@Index('rate_limit_window_start', ['windowStart'])
@Entity({ name: 'rate_limit_window' })
export class RateLimitWindow {
  @PrimaryColumn({ type: 'varchar', length: 200, charset: 'ascii', collation: 'ascii_bin' })
  bucket: string;

  @PrimaryColumn({ type: 'bigint', name: 'window_start', unsigned: true })
  windowStart: string;

  @Column({ type: 'int', unsigned: true })
  hits: number;
}
