// The first answer to a creating request sent with an Idempotency-Key, kept for 24 hours.
import { Column, CreateDateColumn, Entity, PrimaryColumn } from 'typeorm';

@Entity({ name: 'idempotency_keys' })
export class IdempotencyKey {
  /** Whose key it is: the signed-in user, else the session. */
  @PrimaryColumn({ type: 'text' })
  scope!: string;

  @PrimaryColumn({ type: 'text' })
  key!: string;

  @Column({ type: 'text' })
  method!: string;

  @Column({ type: 'text' })
  path!: string;

  @Column({ name: 'request_hash', type: 'text' })
  requestHash!: string;

  /** Null while the first request is still running. */
  @Column({ type: 'integer', nullable: true })
  status!: number | null;

  @Column({ name: 'content_type', type: 'text', nullable: true })
  contentType!: string | null;

  @Column({ type: 'bytea', nullable: true })
  body!: Buffer | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;
}
