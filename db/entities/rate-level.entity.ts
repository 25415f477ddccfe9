// One seeding-rate level of a trial, as a multiplier of the reference rate.
import {
  Column,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import { numericTransformer } from '../transformers';
import { Trial } from './trial.entity';

@Entity({ name: 'rate_levels' })
@Index(['trialId', 'position'], { unique: true })
export class RateLevelRow {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'trial_id', type: 'uuid' })
  trialId!: string;

  @ManyToOne(() => Trial, (trial) => trial.rateLevels, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'trial_id' })
  trial?: Relation<Trial>;

  @Column({ type: 'integer' })
  position!: number;

  @Column({ type: 'numeric', transformer: numericTransformer })
  multiplier!: number;

  @Column({ type: 'text' })
  label!: string;
}
