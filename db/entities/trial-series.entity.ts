// A series: trials of one crop in one network, linked across seasons and pooled together.
import {
  Column,
  CreateDateColumn,
  Entity,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import type { CropKey } from '../../shared/schemas/trial';
import { Network } from './network.entity';

@Entity({ name: 'trial_series' })
export class TrialSeries {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'network_id', type: 'uuid' })
  networkId!: string;

  @ManyToOne(() => Network, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'network_id' })
  network?: Relation<Network>;

  @Column({ type: 'text' })
  name!: string;

  @Column({ type: 'text' })
  crop!: CropKey;

  @Column({ name: 'created_by', type: 'uuid', nullable: true })
  createdBy!: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;
}
