// How many requests one client (an address, an account, a user) made in the current window of a limit.
import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

@Entity({ name: 'rate_limit_hits' })
@Index(['resetAt'])
export class RateLimitHit {
  /** The limit's prefix and the client's key, e.g. `invite:user:<id>`. */
  @PrimaryColumn({ type: 'text' })
  key!: string;

  @Column({ type: 'integer' })
  hits!: number;

  @Column({ name: 'reset_at', type: 'timestamptz' })
  resetAt!: Date;
}
