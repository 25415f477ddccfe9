// A strip: the plot sown at one rate in one block of a site.
import {
  Column,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  OneToOne,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import type { Observation } from './observation.entity';
import { RateLevelRow } from './rate-level.entity';
import { Site } from './site.entity';

@Entity({ name: 'strips' })
@Index(['siteId', 'block', 'position'], { unique: true })
export class Strip {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'site_id', type: 'uuid' })
  siteId!: string;

  @ManyToOne(() => Site, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'site_id' })
  site?: Relation<Site>;

  /** Block number, 1-based, in field order. */
  @Column({ type: 'integer' })
  block!: number;

  /** Position within the block, 1-based, in field order. */
  @Column({ type: 'integer' })
  position!: number;

  @Column({ name: 'rate_level_id', type: 'uuid' })
  rateLevelId!: string;

  @ManyToOne(() => RateLevelRow, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'rate_level_id' })
  rateLevel?: Relation<RateLevelRow>;

  /** Optimistic-lock version of the strip's observations. */
  @Column({ type: 'integer', default: 1 })
  version!: number;

  /** What was measured on the strip; absent until the first entry. */
  // Named by string so this file needs only the type (observation.entity imports Strip).
  @OneToOne('Observation', (observation: Observation) => observation.strip)
  observation?: Relation<Observation> | null;
}
