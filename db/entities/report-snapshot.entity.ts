// A published report: the analysis and data version frozen at publishing time.
import {
  Column,
  CreateDateColumn,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import { User } from './user.entity';

@Entity({ name: 'report_snapshots' })
@Index(['trialId', 'scope'])
@Index(['siteId'])
export class ReportSnapshot {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'text' })
  scope!: 'site' | 'pooled';

  @Column({ name: 'trial_id', type: 'uuid' })
  trialId!: string;

  @Column({ name: 'site_id', type: 'uuid', nullable: true })
  siteId!: string | null;

  /** Site data_version (site scope) or a digest of all site versions (pooled scope). */
  @Column({ name: 'data_version', type: 'text' })
  dataVersion!: string;

  @Column({ type: 'jsonb' })
  report!: Record<string, unknown>;

  @Column({ name: 'published_by', type: 'uuid', nullable: true })
  publishedBy!: string | null;

  @ManyToOne(() => User, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'published_by' })
  publisher?: Relation<User> | null;

  @CreateDateColumn({ name: 'published_at', type: 'timestamptz' })
  publishedAt!: Date;

  /** Null while this snapshot is the live published version. */
  @Column({ name: 'withdrawn_at', type: 'timestamptz', nullable: true })
  withdrawnAt!: Date | null;
}
