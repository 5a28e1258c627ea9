import "server-only";
import { and, count, eq, isNull, ne, sql } from "drizzle-orm";
import type { Db } from "../client";
import { invitations, memberships, organisations, users } from "../schema";
import type { Tx } from "./audit";

/** A firm's members; no hashes or tokens. */
export async function listMembers(db: Db, orgId: string) {
  return db
    .select({ id: users.id, name: users.name, email: users.email, role: users.role, hasPassword: users.passwordHash, disabledAt: users.disabledAt, joinedAt: memberships.createdAt })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.orgId, orgId))
    .orderBy(users.email)
    .then((rows) => rows.map((r) => ({ ...r, hasPassword: Boolean(r.hasPassword) })));
}

export async function getMember(db: Db | Tx, orgId: string, userId: string) {
  const [row] = await db
    .select({ id: users.id, email: users.email, role: users.role, disabledAt: users.disabledAt })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.orgId, orgId), eq(memberships.userId, userId)));
  return row ?? null;
}

export async function countOtherActiveLeads(db: Db | Tx, orgId: string, exceptUserId: string) {
  const [row] = await db
    .select({ n: count() })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.orgId, orgId), eq(users.role, "client_admin"), isNull(users.disabledAt), ne(users.id, exceptUserId)));
  return row?.n ?? 0;
}

/** Invite: the account is made with its role and no password (it signs in by e-mail link). */
export async function createInvitedMember(
  tx: Tx,
  input: { orgId: string; email: string; role: "client" | "client_admin"; invitedById: string; tokenHash: string; expiresAt: Date; unitsPref: "mm" | "in" },
) {
  const [user] = await tx.insert(users).values({ email: input.email, role: input.role, unitsPref: input.unitsPref }).returning({ id: users.id });
  await tx.insert(memberships).values({ orgId: input.orgId, userId: user!.id });
  await tx.insert(invitations).values({ email: input.email, orgId: input.orgId, role: input.role, tokenHash: input.tokenHash, invitedById: input.invitedById, expiresAt: input.expiresAt });
  return user!;
}

/** Remove a member: the membership goes and the account is disabled (its history stays). */
export async function removeMember(tx: Tx, orgId: string, userId: string) {
  await tx.delete(memberships).where(and(eq(memberships.orgId, orgId), eq(memberships.userId, userId)));
  await tx
    .update(users)
    .set({ disabledAt: new Date(), sessionVersion: sql`${users.sessionVersion} + 1` })
    .where(eq(users.id, userId));
}

export async function updateBilling(db: Db | Tx, orgId: string, set: { billingContact: string | null; billingEmail: string | null; defaultPoNumber: string | null }) {
  await db.update(organisations).set(set).where(eq(organisations.id, orgId));
}
