"use server";

import { createHash, randomBytes } from "node:crypto";
import { revalidatePath } from "next/cache";
import { createElement } from "react";
import { z } from "zod";
import { writeAudit } from "@/db/queries/audit";
import { countOtherActiveLeads, createInvitedMember, getMember, removeMember as removeMemberRow, updateBilling } from "@/db/queries/members";
import { getOrganisation, isEmailTaken } from "@/db/queries/organisations";
import MemberInviteEmail from "@/emails/member-invite";
import type { CurrentUser } from "@/lib/auth/guard";
import { sendEmail } from "@/lib/email/send";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { rootLogger } from "@/lib/observability/log";
import { defineAction } from "@/lib/server/define-action";
import { billingSchema, inviteSchema } from "@/lib/validation/request";

const INVITE_DAYS = 7;

/** The firm of a client lead; staff and users without a firm are refused. */
function firmOf(user: CurrentUser): string {
  if (!user.orgId) throw new AppError("forbidden", "Your account is not part of a client firm.");
  return user.orgId;
}

/** A client lead invites a colleague by e-mail (audited); the e-mail failing does not undo the invitation. */
export const inviteMember = defineAction(
  { access: "members:manage", input: inviteSchema, invalid: (error) => new AppError("invalid_input", "Check the e-mail address.", { email: error.issues.map((i) => i.message) }) },
  async (input, { user, db }) => {
    const orgId = firmOf(user);
    const email = input.email.toLowerCase();
    if (await isEmailTaken(db, email)) throw new AppError("conflict", "That e-mail already has an account. Ask the bureau if it should move to your firm.");
    const org = await getOrganisation(db, orgId);
    const created = await db.transaction(async (tx) => {
      const row = await createInvitedMember(tx, {
        orgId,
        email,
        role: input.role,
        invitedById: user.id,
        tokenHash: createHash("sha256").update(randomBytes(32)).digest("hex"),
        expiresAt: new Date(Date.now() + INVITE_DAYS * 86_400_000),
        unitsPref: org?.unitsPref ?? "mm",
      });
      await writeAudit(tx, { actorId: user.id, action: "member.invite", entityType: "user", entityId: row.id, orgId, after: { email, role: input.role } });
      return row;
    });
    await sendEmail({
      to: email,
      subject: `You are invited to ${org?.name ?? "your firm"} on Layerwright`,
      react: createElement(MemberInviteEmail, { firmName: org?.name ?? "your firm", invitedBy: user.name ?? user.email, role: input.role, url: `${env().APP_URL}/sign-in` }),
      tags: [{ name: "template", value: "member-invite" }],
      idempotencyKey: `member-invite/${created.id}`,
    }).catch((e: unknown) => rootLogger().error({ event: "member.invite_mail_failed", err: String(e) }, "member invite e-mail failed"));
    revalidatePath("/portal/firm");
    return { userId: created.id };
  },
);

/** A client lead removes a member (audited); the firm keeps at least one lead. */
export const removeMember = defineAction({ access: "members:manage", input: z.object({ userId: z.string().min(1).max(64) }), invalid: "The request was not valid." }, async ({ userId }, { user, db }) => {
  const orgId = firmOf(user);
  const member = await getMember(db, orgId, userId);
  if (!member) throw new AppError("not_found:member", "That member was not found.");
  if (member.role === "client_admin" && (await countOtherActiveLeads(db, orgId, member.id)) === 0) {
    throw new AppError("conflict", "A firm needs at least one lead: make someone else a lead first.");
  }
  await db.transaction(async (tx) => {
    await removeMemberRow(tx, orgId, member.id);
    await writeAudit(tx, { actorId: user.id, action: "member.remove", entityType: "user", entityId: member.id, orgId, before: { email: member.email, role: member.role } });
  });
  revalidatePath("/portal/firm");
});

/** The firm's billing contact, billing e-mail and default PO number (audited). */
export const saveBilling = defineAction({ access: "billing:manage", input: billingSchema }, async (input, { user, db }) => {
  const orgId = firmOf(user);
  const before = await getOrganisation(db, orgId);
  const set = { billingContact: input.billingContact || null, billingEmail: input.billingEmail || null, defaultPoNumber: input.defaultPoNumber || null };
  await updateBilling(db, orgId, set);
  await writeAudit(db, { actorId: user.id, action: "org.billing", entityType: "organisation", entityId: orgId, orgId, before: before ? { billingContact: before.billingContact, billingEmail: before.billingEmail, defaultPoNumber: before.defaultPoNumber } : null, after: set });
  revalidatePath("/portal/firm");
});
