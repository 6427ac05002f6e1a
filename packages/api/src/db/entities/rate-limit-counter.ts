import { Column, Entity, PrimaryColumn } from 'typeorm';

/** The hits of one client (an address or a user) on one limiter in its current window. */
@Entity({ name: 'rate_limits' })
export class RateLimitCounter {
  @PrimaryColumn({ type: 'varchar', length: 40, charset: 'ascii', collation: 'ascii_bin' })
  limiter!: string;

  @PrimaryColumn({ type: 'varchar', length: 100, charset: 'ascii', collation: 'ascii_bin' })
  clientKey!: string;

  @Column({ type: 'datetime', precision: 3 })
  windowStart!: Date;

  @Column({ type: 'int', unsigned: true })
  hits!: number;
}
