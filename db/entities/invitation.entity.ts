// An invitation to join a network with a role; only a hash of the token is stored.
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
import type { Role } from '../../shared/schemas/common';
import { Network } from './network.entity';

@Entity({ name: 'invitations' })
export class Invitation {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'network_id', type: 'uuid' })
  networkId!: string;

  @ManyToOne(() => Network, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'network_id' })
  network?: Relation<Network>;

  @Column({ type: 'text' })
  email!: string;

  @Column({ type: 'text' })
  role!: Role;

  @Index({ unique: true })
  @Column({ name: 'token_hash', type: 'text' })
  tokenHash!: string;

  @Column({ name: 'invited_by', type: 'uuid', nullable: true })
  invitedBy!: string | null;

  /** The site the grower is invited to run, when the invitation came from site enrolment. */
  @Column({ name: 'site_id', type: 'uuid', nullable: true })
  siteId!: string | null;

  @Column({ name: 'expires_at', type: 'timestamptz' })
  expiresAt!: Date;

  @Column({ name: 'accepted_at', type: 'timestamptz', nullable: true })
  acceptedAt!: Date | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;
}
