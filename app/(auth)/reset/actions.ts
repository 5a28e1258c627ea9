"use server";

import { after } from "next/server";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { getDb } from "@/db/client";
import { clientAddress } from "@/lib/auth/client-address";
import { completePasswordReset, requestPasswordReset } from "@/lib/auth/password-reset";
import { sendEmail } from "@/lib/email/send";
import { env } from "@/lib/env";
import type { ActionResult } from "@/lib/errors";
import { resetPasswordSchema, resetRequestSchema } from "@/lib/validation/password-reset";
import { fieldErrorsOf, formField as field } from "@/lib/validation/form";

type FormResult = ActionResult<undefined> | null;




export async function requestPasswordResetAction(_prev: FormResult, formData: FormData): Promise<FormResult> {
  const parsed = resetRequestSchema.safeParse({ email: field(formData, "email") });
  if (!parsed.success) return { ok: false, code: "invalid_input", message: "Check the highlighted fields.", fieldErrors: fieldErrorsOf(parsed.error) };
  const outcome = await requestPasswordReset(getDb(), {
    email: parsed.data.email,
    address: clientAddress(await headers()),
    appUrl: env().APP_URL,
    now: new Date(),
    // Sent after the answer, so known and unknown addresses take the same time to answer.
    send: (msg) =>
      after(() =>
        sendEmail(msg).catch((e: unknown) => {
          console.error("password reset e-mail failed", e);
        }),
      ),
  });
  if (outcome === "throttled") {
    return { ok: false, code: "rate_limited", message: "Too many reset requests. Please wait 15 minutes before asking again." };
  }
  redirect("/reset/sent");
}

export async function resetPasswordAction(_prev: FormResult, formData: FormData): Promise<FormResult> {
  const parsed = resetPasswordSchema.safeParse({ token: field(formData, "token"), password: field(formData, "password"), confirm: field(formData, "confirm") });
  if (!parsed.success) {
    const fieldErrors = fieldErrorsOf(parsed.error);
    if (fieldErrors.token) return { ok: false, code: "invalid_input", message: fieldErrors.token[0]! };
    return { ok: false, code: "invalid_input", message: "Check the highlighted fields.", fieldErrors };
  }
  const done = await completePasswordReset(getDb(), { token: parsed.data.token, password: parsed.data.password, now: new Date() });
  if (!done) return { ok: false, code: "invalid_input:token", message: "This reset link has expired or has already been used. Ask for a new one." };
  redirect("/reset/done");
}
