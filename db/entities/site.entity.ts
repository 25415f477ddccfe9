// A site: one grower's field enrolled in a trial for one season.
import {
  Column,
  CreateDateColumn,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
  type Relation,
} from 'typeorm';
import { Trial } from './trial.entity';
import { User } from './user.entity';

/** One seeder calibration run recorded by the grower. */
export interface CalibrationRecord {
  recordedAt: string;
  recordedBy: string | null;
  wheelCircumferenceFt: number;
  turns: number;
  seedsCounted: number;
  targetSeedsPerFt: number;
  deliveredSeedsPerFt: number;
  percentOfTarget: number;
  rateLabel: string | null;
  note: string;
}

@Entity({ name: 'sites' })
@Index(['trialId'])
@Index(['growerUserId'])
export class Site {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'trial_id', type: 'uuid' })
  trialId!: string;

  @ManyToOne(() => Trial, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'trial_id' })
  trial?: Relation<Trial>;

  @Column({ name: 'grower_user_id', type: 'uuid', nullable: true })
  growerUserId!: string | null;

  @ManyToOne(() => User, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'grower_user_id' })
  grower?: Relation<User> | null;

  /** Set while the grower has not accepted an invitation yet. */
  @Column({ name: 'grower_email', type: 'text', nullable: true })
  growerEmail!: string | null;

  @Column({ name: 'field_name', type: 'text' })
  fieldName!: string;

  @Column({ type: 'text', default: '' })
  soil!: string;

  @Column({ name: 'previous_crop', type: 'text', default: '' })
  previousCrop!: string;

  @Column({ type: 'text', default: '' })
  fertility!: string;

  @Column({ type: 'text', default: '' })
  notes!: string;

  @Column({ name: 'randomization_seed', type: 'text', nullable: true })
  randomizationSeed!: string | null;

  @Column({ name: 'randomized_at', type: 'timestamptz', nullable: true })
  randomizedAt!: Date | null;

  @Column({ name: 'sowing_date', type: 'date', nullable: true })
  sowingDate!: string | null;

  @Column({ name: 'emergence_date', type: 'date', nullable: true })
  emergenceDate!: string | null;

  @Column({ name: 'heading_date', type: 'date', nullable: true })
  headingDate!: string | null;

  @Column({ name: 'harvest_date', type: 'date', nullable: true })
  harvestDate!: string | null;

  @Column({ type: 'jsonb', default: () => "'[]'" })
  calibrations!: CalibrationRecord[];

  /** Set while the site report is published; strip data is read-only then. */
  @Column({ name: 'published_at', type: 'timestamptz', nullable: true })
  publishedAt!: Date | null;

  /** The grower lets network reports show the farm's field name; otherwise a neutral label. */
  @Column({ name: 'named_in_reports', type: 'boolean', default: false })
  namedInReports!: boolean;

  /** Order of enrolment in the trial (set by a trigger): "Farm C" is number 3. */
  @Column({ name: 'report_number', type: 'integer' })
  reportNumber!: number;

  /** Why the site produced no harvest (hail, flood…); set by a coordinator. */
  @Column({ name: 'lost_reason', type: 'text', nullable: true })
  lostReason!: string | null;

  /** Set when a design amendment changed this site's seed weights after its packet went out. */
  @Column({ name: 'packet_reissued_at', type: 'timestamptz', nullable: true })
  packetReissuedAt!: Date | null;

  /** Bumped on every change to the site's strip data; report snapshots record it. */
  @Column({ name: 'data_version', type: 'integer', default: 0 })
  dataVersion!: number;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt!: Date;
}
