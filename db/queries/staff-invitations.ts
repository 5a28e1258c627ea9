import "server-only";
import { and, eq, gt, inArray, isNotNull, isNull } from "drizzle-orm";
import type { Db } from "../client";
import { STAFF_ROLES, invitations, signInAttempts, users } from "../schema";
import { writeAudit, type Tx } from "./audit";

/** Open (not accepted, not revoked) staff invitations are those without a firm. */
const openStaffInvitation = (tokenHash: string, now: Date) =>
  and(eq(invitations.tokenHash, tokenHash), isNull(invitations.orgId), isNull(invitations.acceptedAt), isNull(invitations.revokedAt), gt(invitations.expiresAt, now));

/** The invitee's e-mail and role when the token hash is open and unexpired (read only: the page checks before showing the form). */
export async function getLiveStaffInvitation(db: Db, tokenHash: string, now: Date): Promise<{ email: string; role: string } | null> {
  const [row] = await db.select({ email: invitations.email, role: invitations.role }).from(invitations).where(openStaffInvitation(tokenHash, now));
  return row ?? null;
}

/** A staff account that was invited and never finished (no password, no accepted invitation): it may be invited again. */
export async function getUnacceptedStaffAccount(db: Db | Tx, email: string): Promise<{ id: string; role: string } | null> {
  const [u] = await db
    .select({ id: users.id, role: users.role, passwordHash: users.passwordHash })
    .from(users)
    .where(and(eq(users.email, email.toLowerCase()), inArray(users.role, [...STAFF_ROLES])));
  if (!u || u.passwordHash) return null;
  const [accepted] = await db
    .select({ id: invitations.id })
    .from(invitations)
    .where(and(eq(invitations.email, email.toLowerCase()), isNull(invitations.orgId), isNotNull(invitations.acceptedAt)));
  return accepted ? null : { id: u.id, role: u.role };
}

/** Revoke the open staff invitations of an address (a new one replaces them). */
export async function revokeOpenStaffInvitations(tx: Tx, email: string, now: Date) {
  await tx
    .update(invitations)
    .set({ revokedAt: now })
    .where(and(eq(invitations.email, email.toLowerCase()), isNull(invitations.orgId), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)));
}

class NoAccount extends Error {}

/**
 * Accept a staff invitation once: the conditional update claims it (open, unexpired), and the
 * invitee's account gets its name and password in the same transaction, so two concurrent uses
 * cannot both succeed. Returns the e-mail to sign in with, or null when the token is unknown,
 * used, revoked or expired, or the account is gone or disabled (nothing is written then).
 */
export async function consumeStaffInvitation(db: Db, input: { tokenHash: string; name: string; passwordHash: string; now: Date }): Promise<{ email: string; userId: string } | null> {
  try {
    return await db.transaction(async (tx) => {
      const [claimed] = await tx.update(invitations).set({ acceptedAt: input.now }).where(openStaffInvitation(input.tokenHash, input.now)).returning({ email: invitations.email });
      if (!claimed) return null;
      const [user] = await tx
        .update(users)
        .set({ name: input.name, passwordHash: input.passwordHash, emailVerified: input.now })
        .where(and(eq(users.email, claimed.email.toLowerCase()), inArray(users.role, [...STAFF_ROLES]), isNull(users.disabledAt)))
        .returning({ id: users.id, email: users.email });
      if (!user) throw new NoAccount();
      // A fresh password lifts a sign-in lock on that e-mail (as a password reset does).
      await tx.delete(signInAttempts).where(eq(signInAttempts.key, `email:${user.email}`));
      await writeAudit(tx, { actorId: user.id, action: "staff.accept_invitation", entityType: "user", entityId: user.id, after: { email: user.email } });
      return { email: user.email, userId: user.id };
    });
  } catch (e) {
    if (e instanceof NoAccount) return null;
    throw e;
  }
}
