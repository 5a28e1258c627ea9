import { eq } from "drizzle-orm";
import type { Db } from "../client";
import { memberships, signInAttempts, twoFactor, users } from "../schema";
import type { ThrottleState } from "../../lib/auth/throttle";

/** The fields the session and the policy need; never the password hash. */
export async function getSessionUser(db: Db, userId: string) {
  const [row] = await db
    .select({
      id: users.id,
      name: users.name,
      email: users.email,
      role: users.role,
      isControlledCleared: users.isControlledCleared,
      unitsPref: users.unitsPref,
      disabledAt: users.disabledAt,
      orgId: memberships.orgId,
      twoFactorConfirmedAt: twoFactor.confirmedAt,
    })
    .from(users)
    .leftJoin(memberships, eq(memberships.userId, users.id))
    .leftJoin(twoFactor, eq(twoFactor.userId, users.id))
    .where(eq(users.id, userId));
  return row ?? null;
}

export async function getUserForSignIn(db: Db, email: string) {
  const [row] = await db
    .select({ id: users.id, passwordHash: users.passwordHash, disabledAt: users.disabledAt, role: users.role, name: users.name, email: users.email })
    .from(users)
    .where(eq(users.email, email.toLowerCase()));
  return row ?? null;
}

export async function getThrottle(db: Db, key: string): Promise<ThrottleState | null> {
  const [row] = await db.select().from(signInAttempts).where(eq(signInAttempts.key, key));
  return row ? { failures: row.failures, windowStartedAt: row.windowStartedAt, lockedUntil: row.lockedUntil } : null;
}

export async function saveThrottle(db: Db, key: string, state: ThrottleState) {
  await db
    .insert(signInAttempts)
    .values({ key, ...state })
    .onConflictDoUpdate({ target: signInAttempts.key, set: { ...state } });
}

export async function clearThrottle(db: Db, key: string) {
  await db.delete(signInAttempts).where(eq(signInAttempts.key, key));
}
