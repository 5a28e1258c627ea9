import "server-only";
import { eq, sql } from "drizzle-orm";
import { readRows, type Db } from "../client";
import type { Role } from "../schema/common";
import { signInAttempts, users } from "../schema";
import type { ThrottleRule, ThrottleState } from "../../lib/auth/throttle";
import type { Tx } from "./audit";

/** The fields the session and the policy need; never the password hash. */
export interface SessionUserRow {
  id: string;
  name: string | null;
  email: string;
  role: Role;
  isControlledCleared: boolean;
  unitsPref: "mm" | "in";
  disabledAt: Date | null;
  sessionVersion: number;
  orgId: string | null;
  twoFactorConfirmedAt: Date | null;
}

const SESSION_USER_SQL =
  "select u.id, u.name, u.email, u.role, u.is_controlled_cleared, u.units_pref, u.disabled_at, u.session_version, m.org_id, t.confirmed_at " +
  "from users u left join memberships m on m.user_id = u.id left join two_factor t on t.user_id = u.id where u.id = ?";

/**
 * The user a session names, read on every request by the guard: one statement prepared once
 * (readRows), so a request pays a few hundredths of a millisecond for it, and nothing is kept
 * between requests (a role change, a disabled account or a new session version apply at once).
 */
export async function getSessionUser(db: Db, userId: string): Promise<SessionUserRow | null> {
  const [row] = await readRows<Record<string, unknown>>(db, SESSION_USER_SQL, [userId]);
  if (!row) return null;
  const at = (v: unknown) => (v === null || v === undefined ? null : new Date(Number(v)));
  return {
    id: String(row.id),
    name: row.name === null ? null : String(row.name),
    email: String(row.email),
    role: row.role as Role,
    isControlledCleared: Boolean(row.is_controlled_cleared),
    unitsPref: row.units_pref === "in" ? "in" : "mm",
    disabledAt: at(row.disabled_at),
    sessionVersion: Number(row.session_version),
    orgId: row.org_id === null || row.org_id === undefined ? null : String(row.org_id),
    twoFactorConfirmedAt: at(row.confirmed_at),
  };
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

/**
 * Count one attempt against `key` in one statement (an upsert with RETURNING), so parallel
 * attempts each see their own number and none is lost: a fresh window starts at 1; the attempt
 * that reaches `rule.maxFailures` locks the key for `rule.lockMs` (unless `lock` is false: the
 * count alone then refuses attempts past the limit until the window ends); a lock in force is kept.
 */
export async function countAttempt(db: Db, key: string, rule: ThrottleRule, now: Date, { lock = true }: { lock?: boolean } = {}): Promise<ThrottleState> {
  const nowMs = now.getTime();
  const windowFrom = nowMs - rule.windowMs;
  const lockUntil = lock ? nowMs + rule.lockMs : null;
  const fresh = sql`${signInAttempts.windowStartedAt} < ${windowFrom}`;
  const count = sql`CASE WHEN ${fresh} THEN 1 ELSE ${signInAttempts.failures} + 1 END`;
  const [row] = await db
    .insert(signInAttempts)
    .values({ key, failures: 1, windowStartedAt: now, lockedUntil: lockUntil !== null && rule.maxFailures <= 1 ? new Date(lockUntil) : null })
    .onConflictDoUpdate({
      target: signInAttempts.key,
      set: {
        failures: count,
        windowStartedAt: sql`CASE WHEN ${fresh} THEN ${nowMs} ELSE ${signInAttempts.windowStartedAt} END`,
        lockedUntil: sql`CASE WHEN ${signInAttempts.lockedUntil} > ${nowMs} THEN ${signInAttempts.lockedUntil} WHEN ${count} >= ${rule.maxFailures} THEN ${lockUntil} ELSE NULL END`,
      },
    })
    .returning({ failures: signInAttempts.failures, windowStartedAt: signInAttempts.windowStartedAt, lockedUntil: signInAttempts.lockedUntil });
  return row!;
}

/** Take back one counted attempt (a sign-in that succeeded is not held against its address). */
export async function uncountAttempt(db: Db, key: string) {
  await db
    .update(signInAttempts)
    .set({ failures: sql`max(${signInAttempts.failures} - 1, 0)` })
    .where(eq(signInAttempts.key, key));
}

/** End every session of a user (sign-out, password reset, role change, removal). */
export async function bumpSessionVersion(db: Db | Tx, userId: string) {
  await db
    .update(users)
    .set({ sessionVersion: sql`${users.sessionVersion} + 1` })
    .where(eq(users.id, userId));
}

export async function getSessionVersion(db: Db, userId: string): Promise<number | null> {
  const [row] = await db.select({ v: users.sessionVersion }).from(users).where(eq(users.id, userId));
  return row ? row.v : null;
}
