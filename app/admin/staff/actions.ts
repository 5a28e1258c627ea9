"use server";

import { createHash, randomBytes } from "node:crypto";
import { createElement } from "react";
import { revalidatePath } from "next/cache";
import { getDb } from "@/db/client";
import { writeAudit } from "@/db/queries/audit";
import { countOtherActiveAdmins, createStaffInvitation, findUserByEmail, getStaffUser, updateStaffUser } from "@/db/queries/staff";
import { users } from "@/db/schema";
import StaffInviteEmail from "@/emails/staff-invite";
import { requirePermission } from "@/lib/auth/guard";
import { sendEmail } from "@/lib/email/send";
import { env } from "@/lib/env";
import { AppError, toActionError, type ActionResult } from "@/lib/errors";
import { inviteStaffSchema, updateStaffSchema } from "@/lib/validation/admin-staff";

const INVITE_DAYS = 7;

/**
 * Invite a staff member: the account is made with the role and no password, and the e-mail
 * tells them to sign in with an e-mail link (the sign-in page sends links to existing accounts).
 */
export async function inviteStaff(raw: { email: string; role: string }): Promise<ActionResult<{ userId: string }>> {
  try {
    const parsed = inviteStaffSchema.safeParse(raw);
    if (!parsed.success) throw new AppError("invalid_input", "Check the highlighted fields.", parsed.error.flatten().fieldErrors as Record<string, string[]>);
    const user = await requirePermission("admin:staff");
    const db = getDb();
    const existing = await findUserByEmail(db, parsed.data.email);
    if (existing) {
      throw new AppError("conflict:email", existing.role === "client" || existing.role === "client_admin" ? "That address belongs to a client account." : "That person is already on the staff.", { email: ["Already has an account."] });
    }
    const token = randomBytes(24).toString("base64url");
    const userId = await db.transaction(async (tx) => {
      const [row] = await tx.insert(users).values({ email: parsed.data.email, role: parsed.data.role }).returning({ id: users.id });
      await createStaffInvitation(tx, {
        email: parsed.data.email,
        role: parsed.data.role,
        tokenHash: createHash("sha256").update(token).digest("hex"),
        invitedById: user.id,
        expiresAt: new Date(Date.now() + INVITE_DAYS * 86_400_000),
      });
      await writeAudit(tx, { actorId: user.id, action: "staff.invite", entityType: "user", entityId: row!.id, after: { email: parsed.data.email, role: parsed.data.role } });
      return row!.id;
    });
    await sendEmail({
      to: parsed.data.email,
      subject: "You are invited to the Layerwright back office",
      react: createElement(StaffInviteEmail, { role: parsed.data.role, invitedBy: user.name ?? user.email, url: `${env().APP_URL}/sign-in` }),
      tags: [{ name: "template", value: "staff-invite" }],
      idempotencyKey: `staff-invite/${userId}`,
    }).catch((e: unknown) => console.error("staff invite e-mail failed", e));
    revalidatePath("/admin/staff");
    return { ok: true, data: { userId } };
  } catch (e) {
    return toActionError(e);
  }
}

/** Change a staff member's role, controlled-work clearance or access; one active admin always remains. */
export async function updateStaff(raw: { userId: string; role?: string; isControlledCleared?: boolean; disabled?: boolean }): Promise<ActionResult<{ userId: string }>> {
  try {
    const parsed = updateStaffSchema.safeParse(raw);
    if (!parsed.success) throw new AppError("invalid_input", "Check the highlighted fields.", parsed.error.flatten().fieldErrors as Record<string, string[]>);
    const input = parsed.data;
    const user = await requirePermission("admin:staff");
    const db = getDb();
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
    return { ok: true, data: { userId: target.id } };
  } catch (e) {
    return toActionError(e);
  }
}
