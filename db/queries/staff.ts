import "server-only";
import { and, asc, eq, inArray, isNull, ne, sql } from "drizzle-orm";
import type { Db } from "../client";
import { STAFF_ROLES, invitations, twoFactor, users } from "../schema";
import type { Tx } from "./audit";

const staffColumns = {
  id: users.id,
  name: users.name,
  email: users.email,
  role: users.role,
  isControlledCleared: users.isControlledCleared,
  disabledAt: users.disabledAt,
  createdAt: users.createdAt,
};

/** Staff with whether each has set up a second factor (the date only, never the secret). */
export async function listStaff(db: Db) {
  return db
    .select({ ...staffColumns, twoFactorSince: twoFactor.confirmedAt })
    .from(users)
    .leftJoin(twoFactor, eq(twoFactor.userId, users.id))
    .where(inArray(users.role, [...STAFF_ROLES]))
    .orderBy(asc(users.role), asc(users.email));
}

export async function getStaffUser(db: Db | Tx, userId: string) {
  const [u] = await db.select(staffColumns).from(users).where(and(eq(users.id, userId), inArray(users.role, [...STAFF_ROLES])));
  return u ?? null;
}

/** Active admins other than `exceptUserId`. */
export async function countOtherActiveAdmins(db: Db | Tx, exceptUserId: string) {
  const [row] = await db
    .select({ n: sql<number>`count(*)` })
    .from(users)
    .where(and(eq(users.role, "admin"), isNull(users.disabledAt), ne(users.id, exceptUserId)));
  return Number(row?.n ?? 0);
}

/** A change of role or of access also ends the member's sessions (they sign in again under the new terms). */
export async function updateStaffUser(tx: Tx, userId: string, set: { role?: (typeof STAFF_ROLES)[number]; isControlledCleared?: boolean; disabledAt?: Date | null }) {
  const endsSessions = set.role !== undefined || set.disabledAt !== undefined;
  await tx
    .update(users)
    .set({ ...set, ...(endsSessions ? { sessionVersion: sql`${users.sessionVersion} + 1` } : {}) })
    .where(eq(users.id, userId));
}

export async function listPendingStaffInvitations(db: Db) {
  return db
    .select({ id: invitations.id, email: invitations.email, role: invitations.role, expiresAt: invitations.expiresAt, createdAt: invitations.createdAt })
    .from(invitations)
    .where(and(isNull(invitations.orgId), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
    .orderBy(asc(invitations.createdAt));
}

export async function createStaffInvitation(tx: Tx, input: { email: string; role: string; tokenHash: string; invitedById: string; expiresAt: Date }) {
  const [row] = await tx.insert(invitations).values({ ...input, orgId: null }).returning({ id: invitations.id });
  return row!.id;
}

export async function findUserByEmail(db: Db | Tx, email: string) {
  const [u] = await db.select({ id: users.id, role: users.role }).from(users).where(eq(users.email, email.toLowerCase()));
  return u ?? null;
}
