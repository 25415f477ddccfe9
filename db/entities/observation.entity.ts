// What was measured on one strip, in the trial's unit system (imperial: ft, lb; metric: m, kg).
import {
  Column,
  Entity,
  JoinColumn,
  OneToOne,
  PrimaryColumn,
  UpdateDateColumn,
  type Relation,
} from 'typeorm';
import { numericTransformer } from '../transformers';
import { Strip } from './strip.entity';

@Entity({ name: 'observations' })
export class Observation {
  @PrimaryColumn({ name: 'strip_id', type: 'uuid' })
  stripId!: string;

  @OneToOne(() => Strip, (strip) => strip.observation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'strip_id' })
  strip?: Relation<Strip>;

  @Column({ name: 'seeds_sown', type: 'integer', nullable: true })
  seedsSown!: number | null;

  /** Plants counted on each subsample of row (up to 6). */
  @Column({ name: 'stand_counts', type: 'jsonb', default: () => "'[]'" })
  standCounts!: number[];

  @Column({
    name: 'stand_row_length',
    type: 'numeric',
    nullable: true,
    transformer: numericTransformer,
  })
  standRowLength!: number | null;

  @Column({ name: 'tiller_plants', type: 'integer', nullable: true })
  tillerPlants!: number | null;

  @Column({ name: 'tiller_count', type: 'integer', nullable: true })
  tillerCount!: number | null;

  @Column({ name: 'head_counts', type: 'jsonb', default: () => "'[]'" })
  headCounts!: number[];

  @Column({
    name: 'head_row_length',
    type: 'numeric',
    nullable: true,
    transformer: numericTransformer,
  })
  headRowLength!: number | null;

  @Column({
    name: 'grain_weight',
    type: 'numeric',
    nullable: true,
    transformer: numericTransformer,
  })
  grainWeight!: number | null;

  @Column({ name: 'harvest_rows', type: 'integer', nullable: true })
  harvestRows!: number | null;

  @Column({
    name: 'harvest_length',
    type: 'numeric',
    nullable: true,
    transformer: numericTransformer,
  })
  harvestLength!: number | null;

  /** Harvested area when it is not rows × length (ft² or m²). */
  @Column({
    name: 'harvest_area',
    type: 'numeric',
    nullable: true,
    transformer: numericTransformer,
  })
  harvestArea!: number | null;

  @Column({
    name: 'moisture_pct',
    type: 'numeric',
    nullable: true,
    transformer: numericTransformer,
  })
  moisturePct!: number | null;

  @Column({ name: 'test_weight', type: 'numeric', nullable: true, transformer: numericTransformer })
  testWeight!: number | null;

  @Column({ name: 'sowing_date', type: 'date', nullable: true })
  sowingDate!: string | null;

  @Column({ name: 'emergence_date', type: 'date', nullable: true })
  emergenceDate!: string | null;

  @Column({ name: 'heading_date', type: 'date', nullable: true })
  headingDate!: string | null;

  @Column({ name: 'harvest_date', type: 'date', nullable: true })
  harvestDate!: string | null;

  @Column({ type: 'text', default: '' })
  notes!: string;

  @Column({ name: 'updated_by', type: 'uuid', nullable: true })
  updatedBy!: string | null;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt!: Date;
}
