// A user's role in one network (admin, coordinator, grower or member).
import {
  Column,
  CreateDateColumn,
  Entity,
  Index,
  ManyToOne,
  PrimaryGeneratedColumn,
  JoinColumn,
  type Relation,
} from 'typeorm';
import type { Role } from '../../shared/schemas/common';
import { Network } from './network.entity';
import { User } from './user.entity';

@Entity({ name: 'memberships' })
@Index(['userId', 'networkId'], { unique: true })
export class Membership {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'user_id', type: 'uuid' })
  userId!: string;

  @ManyToOne(() => User, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id' })
  user?: Relation<User>;

  @Column({ name: 'network_id', type: 'uuid' })
  networkId!: string;

  @ManyToOne(() => Network, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'network_id' })
  network?: Relation<Network>;

  @Column({ type: 'text' })
  role!: Role;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;
}
