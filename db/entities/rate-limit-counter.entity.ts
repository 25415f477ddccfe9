// A fixed-window request counter shared by every worker process (express-rate-limit store).
import { Column, Entity, PrimaryColumn } from 'typeorm';

@Entity({ name: 'rate_limit_counters' })
export class RateLimitCounter {
  @PrimaryColumn({ type: 'text' })
  key!: string;

  @Column({ type: 'integer' })
  hits!: number;

  @Column({ name: 'reset_at', type: 'timestamptz' })
  resetAt!: Date;
}
