// A signed-in browser session, written and read by connect-pg-simple (express-session's store).
import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

@Entity({ name: 'user_sessions' })
@Index(['expire'])
export class UserSession {
  @PrimaryColumn({ type: 'varchar' })
  sid!: string;

  /** express-session's data; passport keeps the signed-in user's id at `passport.user`. */
  @Column({ type: 'json' })
  sess!: { passport?: { user?: string }; [key: string]: unknown };

  @Column({ type: 'timestamp', precision: 6 })
  expire!: Date;
}
