import "server-only";
import type { Db } from "@/db/client";
import { consumeStaffInvitation, getLiveStaffInvitation } from "@/db/queries/staff-invitations";
import { hashPassword } from "./password";
import { hashResetToken, newResetToken } from "./password-reset";

/**
 * Staff invitations reuse the password-reset token scheme: 32 random bytes sent once in the
 * link, only their SHA-256 stored, claimed once by a conditional update.
 */

/** An invitation link works for 7 days (common practice for account invitations). */
export const INVITE_TTL_MS = 7 * 86_400_000;

/** A fresh token for the link and the hash to store. */
export function newInvitationToken(): { token: string; tokenHash: string } {
  const token = newResetToken();
  return { token, tokenHash: hashResetToken(token) };
}

export function invitationUrl(appUrl: string, token: string): string {
  return `${appUrl.replace(/\/$/, "")}/invite/accept?token=${token}`;
}

/** The invitee's e-mail and role while the link is open; null when unknown, used, revoked or expired. */
export async function openInvitation(db: Db, token: string, now: Date) {
  return getLiveStaffInvitation(db, hashResetToken(token), now);
}

/** Set the invitee's name and password with the link's token, once. Null when the link no longer works. */
export async function acceptStaffInvitation(db: Db, input: { token: string; name: string; password: string; now: Date }): Promise<{ email: string; userId: string } | null> {
  const passwordHash = await hashPassword(input.password);
  return consumeStaffInvitation(db, { tokenHash: hashResetToken(input.token), name: input.name, passwordHash, now: input.now });
}
