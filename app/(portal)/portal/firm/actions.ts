"use server";

import { createHash, randomBytes } from "node:crypto";
import { revalidatePath } from "next/cache";
import { createElement } from "react";
import { getDb } from "@/db/client";
import { writeAudit } from "@/db/queries/audit";
import { countOtherActiveLeads, createInvitedMember, getMember, removeMember as removeMemberRow, updateBilling } from "@/db/queries/members";
import { getOrganisation, isEmailTaken } from "@/db/queries/organisations";
import MemberInviteEmail from "@/emails/member-invite";
import { requirePermission } from "@/lib/auth/guard";
import { sendEmail } from "@/lib/email/send";
import { env } from "@/lib/env";
import { AppError, toActionError, type ActionResult } from "@/lib/errors";
import { billingSchema, inviteSchema } from "@/lib/validation/request";

const INVITE_DAYS = 7;

async function leadOfFirm() {
  const user = await requirePermission("members:manage");
  if (!user.orgId) throw new AppError("forbidden", "Your account is not part of a client firm.");
  return { user, orgId: user.orgId };
}

export async function inviteMember(raw: { email: string; role: string }): Promise<ActionResult<{ userId: string }>> {
  const parsed = inviteSchema.safeParse(raw);
  if (!parsed.success) return { ok: false, code: "invalid_input", message: "Check the e-mail address.", fieldErrors: { email: parsed.error.issues.map((i) => i.message) } };
  try {
    const { user, orgId } = await leadOfFirm();
    const db = getDb();
    const email = parsed.data.email.toLowerCase();
    if (await isEmailTaken(db, email)) throw new AppError("conflict", "That e-mail already has an account. Ask the bureau if it should move to your firm.");
    const org = await getOrganisation(db, orgId);
    const created = await db.transaction(async (tx) => {
      const row = await createInvitedMember(tx, {
        orgId,
        email,
        role: parsed.data.role,
        invitedById: user.id,
        tokenHash: createHash("sha256").update(randomBytes(32)).digest("hex"),
        expiresAt: new Date(Date.now() + INVITE_DAYS * 86_400_000),
        unitsPref: org?.unitsPref ?? "mm",
      });
      await writeAudit(tx, { actorId: user.id, action: "member.invite", entityType: "user", entityId: row.id, orgId, after: { email, role: parsed.data.role } });
      return row;
    });
    await sendEmail({
      to: email,
      subject: `You are invited to ${org?.name ?? "your firm"} on Layerwright`,
      react: createElement(MemberInviteEmail, { firmName: org?.name ?? "your firm", invitedBy: user.name ?? user.email, role: parsed.data.role, url: `${env().APP_URL}/sign-in` }),
      tags: [{ name: "template", value: "member-invite" }],
      idempotencyKey: `member-invite/${created.id}`,
    }).catch((e: unknown) => console.error("member invite e-mail failed", e));
    revalidatePath("/portal/firm");
    return { ok: true, data: { userId: created.id } };
  } catch (e) {
    return toActionError(e);
  }
}

export async function removeMember(raw: { userId: string }): Promise<ActionResult> {
  try {
    if (!raw || typeof raw !== "object") throw new AppError("invalid_input", "The request was not valid.");
    const { user, orgId } = await leadOfFirm();
    const db = getDb();
    const member = await getMember(db, orgId, String(raw.userId));
    if (!member) throw new AppError("not_found:member", "That member was not found.");
    if (member.role === "client_admin" && (await countOtherActiveLeads(db, orgId, member.id)) === 0) {
      throw new AppError("conflict", "A firm needs at least one lead: make someone else a lead first.");
    }
    await db.transaction(async (tx) => {
      await removeMemberRow(tx, orgId, member.id);
      await writeAudit(tx, { actorId: user.id, action: "member.remove", entityType: "user", entityId: member.id, orgId, before: { email: member.email, role: member.role } });
    });
    revalidatePath("/portal/firm");
    return { ok: true, data: undefined };
  } catch (e) {
    return toActionError(e);
  }
}

export async function saveBilling(raw: { billingContact: string; billingEmail: string; defaultPoNumber: string }): Promise<ActionResult> {
  const parsed = billingSchema.safeParse(raw);
  if (!parsed.success) {
    const fe: Record<string, string[]> = {};
    for (const i of parsed.error.issues) (fe[i.path.join(".")] ??= []).push(i.message);
    return { ok: false, code: "invalid_input", message: "Check the highlighted fields.", fieldErrors: fe };
  }
  try {
    const user = await requirePermission("billing:manage");
    if (!user.orgId) throw new AppError("forbidden", "Your account is not part of a client firm.");
    const db = getDb();
    const before = await getOrganisation(db, user.orgId);
    const set = { billingContact: parsed.data.billingContact || null, billingEmail: parsed.data.billingEmail || null, defaultPoNumber: parsed.data.defaultPoNumber || null };
    await updateBilling(db, user.orgId, set);
    await writeAudit(db, { actorId: user.id, action: "org.billing", entityType: "organisation", entityId: user.orgId, orgId: user.orgId, before: before ? { billingContact: before.billingContact, billingEmail: before.billingEmail, defaultPoNumber: before.defaultPoNumber } : null, after: set });
    revalidatePath("/portal/firm");
    return { ok: true, data: undefined };
  } catch (e) {
    return toActionError(e);
  }
}
