"use server";

import { createElement } from "react";
import { revalidatePath } from "next/cache";
import { writeAudit } from "@/db/queries/audit";
import { countOtherActiveAdmins, createStaffInvitation, findUserByEmail, getStaffUser, updateStaffUser } from "@/db/queries/staff";
import { getUnacceptedStaffAccount, revokeOpenStaffInvitations } from "@/db/queries/staff-invitations";
import { removeTwoFactor } from "@/db/queries/two-factor";
import { users } from "@/db/schema";
import StaffInviteEmail from "@/emails/staff-invite";
import { INVITE_TTL_MS, invitationUrl, newInvitationToken } from "@/lib/auth/staff-invitation";
import { sendEmail } from "@/lib/email/send";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { defineAction } from "@/lib/server/define-action";
import { inviteStaffSchema, resetTwoFactorSchema, updateStaffSchema } from "@/lib/validation/admin-staff";
import { formatDate } from "@/lib/dates";

const dayText = (d: Date) => formatDate(d);

/**
 * Invite a staff member: the account is made with the role and no password, and the e-mail
 * links to the accept page, where they set their name and password (the link works once, for
 * 7 days). Inviting an address whose invitation was never accepted sends a fresh link and
 * revokes the old one; the account keeps its role.
 */
export const inviteStaff = defineAction({ access: "admin:staff", input: inviteStaffSchema }, async (input, { user, db }) => {
  const { email } = input;
  const existing = await findUserByEmail(db, email);
  const unaccepted = existing ? await getUnacceptedStaffAccount(db, email) : null;
  if (existing && !unaccepted) {
    throw new AppError("conflict:email", existing.role === "client" || existing.role === "client_admin" ? "That address belongs to a client account." : "That person is already on the staff.", { email: ["Already has an account."] });
  }
  const role = unaccepted ? (unaccepted.role as typeof input.role) : input.role;
  const { token, tokenHash } = newInvitationToken();
  const now = new Date();
  const expiresAt = new Date(now.getTime() + INVITE_TTL_MS);
  const userId = await db.transaction(async (tx) => {
    let id = unaccepted?.id;
    if (id) await revokeOpenStaffInvitations(tx, email, now);
    else id = (await tx.insert(users).values({ email, role }).returning({ id: users.id }))[0]!.id;
    await createStaffInvitation(tx, { email, role, tokenHash, invitedById: user.id, expiresAt });
    await writeAudit(tx, { actorId: user.id, action: unaccepted ? "staff.reinvite" : "staff.invite", entityType: "user", entityId: id, after: { email, role, expiresAt } });
    return id;
  });
  await sendEmail({
    to: email,
    subject: "You are invited to the Layerwright back office",
    react: createElement(StaffInviteEmail, { role, invitedBy: user.name ?? user.email, url: invitationUrl(env().APP_URL, token), expiresText: dayText(expiresAt) }),
    tags: [{ name: "template", value: "staff-invite" }],
    idempotencyKey: `staff-invite/${tokenHash}`,
  }).catch((e: unknown) => console.error("staff invite e-mail failed", e));
  revalidatePath("/admin/staff");
  return { userId, isResent: Boolean(unaccepted) };
});

/** Change a staff member's role, controlled-work clearance or access; one active admin always remains. */
export const updateStaff = defineAction({ access: "admin:staff", input: updateStaffSchema }, async (input, { user, db }) => {
  const target = await getStaffUser(db, input.userId);
  if (!target) throw new AppError("not_found:user", "That staff member was not found.");
  const losesAdmin = target.role === "admin" && !target.disabledAt && ((input.role && input.role !== "admin") || input.disabled === true);
  await db.transaction(async (tx) => {
    if (losesAdmin && (await countOtherActiveAdmins(tx, target.id)) === 0) {
      throw new AppError("conflict:last_admin", "At least one admin must remain; make someone else admin first.");
    }
    const set = {
      ...(input.role ? { role: input.role } : {}),
      ...(input.isControlledCleared !== undefined ? { isControlledCleared: input.isControlledCleared } : {}),
      ...(input.disabled !== undefined ? { disabledAt: input.disabled ? new Date() : null } : {}),
    };
    await updateStaffUser(tx, target.id, set);
    await writeAudit(tx, {
      actorId: user.id,
      action: "staff.update",
      entityType: "user",
      entityId: target.id,
      before: { role: target.role, isControlledCleared: target.isControlledCleared, disabled: Boolean(target.disabledAt) },
      after: { role: input.role ?? target.role, isControlledCleared: input.isControlledCleared ?? target.isControlledCleared, disabled: input.disabled ?? Boolean(target.disabledAt) },
    });
  });
  revalidatePath("/admin/staff");
  return { userId: target.id };
});

/**
 * Clear a staff member's authenticator app and recovery codes (a lost phone). Their next sign-in
 * takes the password alone and then asks them to set up a new app before anything else. Audited.
 */
export const resetStaffTwoFactor = defineAction({ access: "admin:staff", input: resetTwoFactorSchema }, async (input, { user, db }) => {
  const target = await getStaffUser(db, input.userId);
  if (!target) throw new AppError("not_found:user", "That staff member was not found.");
  const removed = await removeTwoFactor(db, { userId: target.id, actorId: user.id, reason: "reset_by_admin" });
  if (!removed) throw new AppError("conflict:not_enrolled", "That staff member has no authenticator app set up.");
  revalidatePath("/admin/staff");
  return { userId: target.id };
});
