"use server";

import { AuthError } from "next-auth";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { createElement } from "react";
import { getDb } from "@/db/client";
import { countAttempt, getUserForSignIn } from "@/db/queries/auth";
import { createClientFirmWithAdmin, isEmailTaken } from "@/db/queries/organisations";
import WelcomeEmail from "@/emails/welcome";
import { clientAddress } from "@/lib/auth/client-address";
import { signIn, signOut } from "@/lib/auth/config";
import { hashPassword } from "@/lib/auth/password";
import { homePathFor } from "@/lib/auth/policy";
import { isOverLimit, SIGNUP_ADDRESS_RULE, SIGNUP_EMAIL_RULE } from "@/lib/auth/throttle";
import { sendEmail } from "@/lib/email/send";
import { env } from "@/lib/env";
import type { ActionResult } from "@/lib/errors";
import { magicLinkSchema, safeCallbackPath, signInSchema, signUpSchema } from "@/lib/validation/auth";
import { fieldErrorsOf } from "@/lib/validation/form";

type FormResult = ActionResult<undefined> | null;

/** The form's fields; anything else posted to the action (no form at all) counts as empty. */
const formEntries = (formData: unknown) => (formData instanceof FormData ? Object.fromEntries(formData) : {});
/** Fields named `address.x` become `{ address: { x } }` (the sign-up form's billing address). */
const nested = (entries: Record<string, unknown>) => {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(entries)) {
    const dot = k.indexOf(".");
    if (dot > 0) ((out[k.slice(0, dot)] ??= {}) as Record<string, unknown>)[k.slice(dot + 1)] = v;
    else out[k] = v;
  }
  return out;
};


export async function signInWithPassword(_prev: FormResult, formData: FormData): Promise<FormResult> {
  const parsed = signInSchema.safeParse(formEntries(formData));
  if (!parsed.success) {
    return { ok: false, code: "invalid_input", message: "Check the highlighted fields.", fieldErrors: fieldErrorsOf(parsed.error) };
  }
  const { email, password, code, callbackUrl } = parsed.data;
  try {
    await signIn("credentials", { email, password, ...(code ? { code } : {}), redirect: false });
  } catch (e) {
    if (e instanceof AuthError) {
      const reason = (e as AuthError & { code?: string }).code;
      if (reason === "code_required") {
        return { ok: false, code: "code_required", message: "Enter the 6-digit code from your authenticator app, or one of your recovery codes." };
      }
      if (reason === "code_invalid") {
        return {
          ok: false,
          code: "code_invalid",
          message: "That code did not work.",
          fieldErrors: { code: ["Wrong, expired or already used. Wait for the app's next code and enter it."] },
        };
      }
      const locked = reason === "locked";
      return {
        ok: false,
        code: locked ? "rate_limited" : "unauthenticated",
        message: locked
          ? "Too many failed attempts. Sign-in is paused for 15 minutes; you can use an e-mail link meanwhile."
          : "That e-mail and password do not match an account.",
      };
    }
    throw e;
  }
  const user = await getUserForSignIn(getDb(), email);
  redirect(safeCallbackPath(callbackUrl) ?? homePathFor(user?.role ?? "client"));
}

export async function requestMagicLink(_prev: FormResult, formData: FormData): Promise<FormResult> {
  const parsed = magicLinkSchema.safeParse(formEntries(formData));
  if (!parsed.success) {
    return { ok: false, code: "invalid_input", message: "Check the highlighted fields.", fieldErrors: fieldErrorsOf(parsed.error) };
  }
  try {
    await signIn("email", { email: parsed.data.email.toLowerCase(), redirect: false, redirectTo: "/after-sign-in" });
  } catch (e) {
    // Say nothing that tells whether the address has an account; log what went wrong.
    if (!(e instanceof AuthError)) throw e;
    console.error("sign-in link request failed", e.type);
  }
  redirect("/sign-in/check-email");
}

export async function signUp(_prev: FormResult, formData: FormData): Promise<FormResult> {
  const parsed = signUpSchema.safeParse(nested(formEntries(formData)));
  if (!parsed.success) {
    return { ok: false, code: "invalid_input", message: "Check the highlighted fields.", fieldErrors: fieldErrorsOf(parsed.error) };
  }
  const input = { ...parsed.data, email: parsed.data.email.toLowerCase() };
  const db = getDb();
  // Every attempt counts, so the form cannot be used to try address after address.
  const now = new Date();
  const address = clientAddress(await headers());
  const byEmail = await countAttempt(db, `signup:email:${input.email}`, SIGNUP_EMAIL_RULE, now);
  const byAddress = address ? await countAttempt(db, `signup:addr:${address}`, SIGNUP_ADDRESS_RULE, now) : null;
  if (isOverLimit(byEmail, SIGNUP_EMAIL_RULE) || (byAddress && isOverLimit(byAddress, SIGNUP_ADDRESS_RULE))) {
    return { ok: false, code: "rate_limited", message: "Too many sign-up attempts. Please wait 15 minutes before trying again." };
  }
  if (await isEmailTaken(db, input.email)) {
    return {
      ok: false,
      code: "conflict",
      message: "An account with this e-mail already exists. Sign in, or ask your firm's lead to invite you.",
      fieldErrors: { email: ["Already registered."] },
    };
  }
  await createClientFirmWithAdmin(db, { ...input, passwordHash: await hashPassword(input.password) });
  try {
    await sendEmail({
      to: input.email,
      subject: "Welcome to Layerwright",
      react: createElement(WelcomeEmail, { name: input.name, firmName: input.firmName, portalUrl: `${env().APP_URL}/portal` }),
      tags: [{ name: "template", value: "welcome" }],
    });
  } catch (e) {
    // The account exists; a failed welcome e-mail must not undo it.
    console.error("welcome e-mail failed", e);
  }
  await signIn("credentials", { email: input.email, password: input.password, redirect: false });
  redirect("/portal");
}

export async function signOutAction() {
  await signOut({ redirectTo: "/" });
}
