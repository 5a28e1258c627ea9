"use server";

import { redirect } from "next/navigation";
import { acceptStaffInvitation } from "@/lib/auth/staff-invitation";
import { AppError } from "@/lib/errors";
import { defineFormAction, fieldErrorsByPath } from "@/lib/server/define-action";
import { acceptInvitationSchema } from "@/lib/validation/staff-invitation";

/**
 * The invitee sets their name and password with the invitation's one-time token. Anyone may call
 * it (the invitee is signed out): the token is the credential, checked and claimed in one write.
 */
export const acceptInvitationAction = defineFormAction(
  {
    access: "public",
    input: acceptInvitationSchema,
    invalid: (error) => {
      const fieldErrors = fieldErrorsByPath(error);
      return fieldErrors.token ? new AppError("invalid_input:token", fieldErrors.token[0]!) : new AppError("invalid_input", "Check the highlighted fields.", fieldErrors);
    },
  },
  async ({ token, name, password }, { db }) => {
    const accepted = await acceptStaffInvitation(db, { token, name, password, now: new Date() });
    if (!accepted) throw new AppError("invalid_input:token", "This invitation has expired or has already been used. Ask your bureau's admin for a new one.");
    redirect("/invite/done");
  },
);
