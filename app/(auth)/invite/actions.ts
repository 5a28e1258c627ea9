"use server";

import { redirect } from "next/navigation";
import { getDb } from "@/db/client";
import { acceptStaffInvitation } from "@/lib/auth/staff-invitation";
import type { ActionResult } from "@/lib/errors";
import { acceptInvitationSchema } from "@/lib/validation/staff-invitation";
import { fieldErrorsOf, formField as field } from "@/lib/validation/form";

type FormResult = ActionResult<undefined> | null;



/**
 * The invitee sets their name and password with the invitation's one-time token. Anyone may call
 * it (the invitee is signed out): the token is the credential, checked and claimed in one write.
 */
export async function acceptInvitationAction(_prev: FormResult, formData: FormData): Promise<FormResult> {
  const parsed = acceptInvitationSchema.safeParse({ token: field(formData, "token"), name: field(formData, "name"), password: field(formData, "password"), confirm: field(formData, "confirm") });
  if (!parsed.success) {
    const fieldErrors = fieldErrorsOf(parsed.error);
    if (fieldErrors.token) return { ok: false, code: "invalid_input:token", message: fieldErrors.token[0]! };
    return { ok: false, code: "invalid_input", message: "Check the highlighted fields.", fieldErrors };
  }
  const accepted = await acceptStaffInvitation(getDb(), { token: parsed.data.token, name: parsed.data.name, password: parsed.data.password, now: new Date() });
  if (!accepted) return { ok: false, code: "invalid_input:token", message: "This invitation has expired or has already been used. Ask your bureau's admin for a new one." };
  redirect("/invite/done");
}
