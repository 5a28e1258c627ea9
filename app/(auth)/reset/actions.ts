"use server";

import { after } from "next/server";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { clientAddress } from "@/lib/auth/client-address";
import { completePasswordReset, requestPasswordReset } from "@/lib/auth/password-reset";
import { sendEmail } from "@/lib/email/send";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { rootLogger } from "@/lib/observability/log";
import { defineFormAction, fieldErrorsByPath } from "@/lib/server/define-action";
import { resetPasswordSchema, resetRequestSchema } from "@/lib/validation/password-reset";

/** A reset link by e-mail; known and unknown addresses get the same answer in the same time. */
export const requestPasswordResetAction = defineFormAction({ access: "public", input: resetRequestSchema }, async ({ email }, { db }) => {
  const outcome = await requestPasswordReset(db, {
    email,
    address: clientAddress(await headers()),
    appUrl: env().APP_URL,
    now: new Date(),
    // Sent after the answer, so known and unknown addresses take the same time to answer.
    send: (msg) => after(() => sendEmail(msg).catch((e: unknown) => rootLogger().error({ event: "auth.reset_mail_failed", err: String(e) }, "password reset e-mail failed"))),
  });
  if (outcome === "throttled") throw new AppError("rate_limited", "Too many reset requests. Please wait 15 minutes before asking again.");
  redirect("/reset/sent");
});

/** A new password with the e-mailed one-time token; a bad link says so on its own, not as a field. */
export const resetPasswordAction = defineFormAction(
  {
    access: "public",
    input: resetPasswordSchema,
    invalid: (error) => {
      const fieldErrors = fieldErrorsByPath(error);
      return fieldErrors.token ? new AppError("invalid_input", fieldErrors.token[0]!) : new AppError("invalid_input", "Check the highlighted fields.", fieldErrors);
    },
  },
  async ({ token, password }, { db }) => {
    const done = await completePasswordReset(db, { token, password, now: new Date() });
    if (!done) throw new AppError("invalid_input:token", "This reset link has expired or has already been used. Ask for a new one.");
    redirect("/reset/done");
  },
);
