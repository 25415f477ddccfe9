// A seeding-rate trial: one crop and season, its rate levels and strip layout.
import {
  Column,
  CreateDateColumn,
  Entity,
  JoinColumn,
  ManyToOne,
  OneToMany,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
  type Relation,
} from 'typeorm';
import type {
  CropKey,
  CustomCrop,
  RateUnit,
  TrialStatus,
  UnitSystem,
} from '../../shared/schemas/trial';
import { numericTransformer } from '../transformers';
import { Network } from './network.entity';
import type { RateLevelRow } from './rate-level.entity';

@Entity({ name: 'trials' })
export class Trial {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'network_id', type: 'uuid' })
  networkId!: string;

  @ManyToOne(() => Network, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'network_id' })
  network?: Relation<Network>;

  @Column({ type: 'text' })
  name!: string;

  @Column({ type: 'text', default: '' })
  question!: string;

  @Column({ type: 'text', default: 'draft' })
  status!: TrialStatus;

  @Column({ type: 'text', nullable: true })
  crop!: CropKey | null;

  @Column({ name: 'custom_crop', type: 'jsonb', nullable: true })
  customCrop!: CustomCrop | null;

  @Column({ type: 'text', nullable: true })
  season!: string | null;

  @Column({ name: 'unit_system', type: 'text', default: 'imperial' })
  unitSystem!: UnitSystem;

  @Column({
    name: 'reference_rate',
    type: 'numeric',
    nullable: true,
    transformer: numericTransformer,
  })
  referenceRate!: number | null;

  @Column({ name: 'reference_unit', type: 'text', nullable: true })
  referenceUnit!: RateUnit | null;

  @Column({ name: 'blocks_per_site', type: 'integer', nullable: true })
  blocksPerSite!: number | null;

  @Column({ name: 'rows_per_strip', type: 'integer', nullable: true })
  rowsPerStrip!: number | null;

  @Column({
    name: 'row_spacing_in',
    type: 'numeric',
    nullable: true,
    transformer: numericTransformer,
  })
  rowSpacingIn!: number | null;

  @Column({
    name: 'strip_length_ft',
    type: 'numeric',
    nullable: true,
    transformer: numericTransformer,
  })
  stripLengthFt!: number | null;

  @Column({ name: 'border_rows', type: 'integer', nullable: true })
  borderRows!: number | null;

  @Column({
    name: 'thousand_kernel_weight_g',
    type: 'numeric',
    nullable: true,
    transformer: numericTransformer,
  })
  thousandKernelWeightG!: number | null;

  @Column({
    name: 'germination_pct',
    type: 'numeric',
    nullable: true,
    transformer: numericTransformer,
  })
  germinationPct!: number | null;

  @Column({
    name: 'emergence_pct',
    type: 'numeric',
    nullable: true,
    transformer: numericTransformer,
  })
  emergencePct!: number | null;

  @Column({
    name: 'seed_price_per_lb',
    type: 'numeric',
    nullable: true,
    transformer: numericTransformer,
  })
  seedPricePerLb!: number | null;

  @Column({
    name: 'grain_price_per_bu',
    type: 'numeric',
    nullable: true,
    transformer: numericTransformer,
  })
  grainPricePerBu!: number | null;

  @Column({ name: 'closed_at', type: 'timestamptz', nullable: true })
  closedAt!: Date | null;

  @Column({ name: 'public_link_token', type: 'text', nullable: true, unique: true })
  publicLinkToken!: string | null;

  @Column({ name: 'created_by', type: 'uuid', nullable: true })
  createdBy!: string | null;

  /** The series this trial belongs to (trials of one crop linked across seasons), if any. */
  @Column({ name: 'series_id', type: 'uuid', nullable: true })
  seriesId!: string | null;

  // Named by string so this file needs only the type: the rate level imports Trial, and a
  // value import both ways would be an import cycle.
  @OneToMany('RateLevelRow', (level: RateLevelRow) => level.trial)
  rateLevels?: Relation<RateLevelRow[]>;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt!: Date;
}
