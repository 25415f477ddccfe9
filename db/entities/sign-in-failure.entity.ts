// One wrong password for an account from one client address; counted by the sign-in limiter.
import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

@Entity({ name: 'sign_in_failures' })
export class SignInFailure {
  @PrimaryGeneratedColumn('increment', { type: 'bigint' })
  id!: string;

  /** The e-mail as typed (trimmed, lower case); it need not belong to an account. */
  @Column({ type: 'text' })
  account!: string;

  @Column({ type: 'text' })
  address!: string;

  @Column({ name: 'failed_at', type: 'timestamptz', default: () => 'now()' })
  failedAt!: Date;
}
