// Ending the stored browser sessions of given accounts (connect-pg-simple's rows).
import type { EntityManager } from 'typeorm';
import { UserSession } from '../entities/user-session.entity';

/** Signs the given accounts out everywhere, in the caller's transaction. */
export async function endSessionsOf(
  manager: EntityManager,
  userIds: readonly string[],
): Promise<void> {
  if (userIds.length === 0) return;
  await manager
    .getRepository(UserSession)
    .createQueryBuilder()
    .delete()
    // The account id sits inside the session's json (passport.user), which no column holds.
    .where("sess->'passport'->>'user' IN (:...userIds)", { userIds })
    .execute();
}
