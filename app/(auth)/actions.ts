"use server";

import { AuthError } from "next-auth";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { createElement } from "react";
import { z } from "zod";
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
import { AppError } from "@/lib/errors";
import { rootLogger } from "@/lib/observability/log";
import { defineAction, defineFormAction } from "@/lib/server/define-action";
import { magicLinkSchema, safeCallbackPath, signInSchema, signUpSchema } from "@/lib/validation/auth";
import { nestedFields } from "@/lib/validation/form";

/** Password sign-in (with the second factor's code when the account has one); answers in the form's words. */
export const signInWithPassword = defineFormAction({ access: "public", input: signInSchema }, async ({ email, password, code, callbackUrl }, { db }) => {
  try {
    await signIn("credentials", { email, password, ...(code ? { code } : {}), redirect: false });
  } catch (e) {
    if (!(e instanceof AuthError)) throw e;
    const reason = (e as AuthError & { code?: string }).code;
    if (reason === "code_required") throw new AppError("unauthenticated:code_required", "Enter the 6-digit code from your authenticator app, or one of your recovery codes.");
    if (reason === "code_invalid") {
      throw new AppError("unauthenticated:code_invalid", "That code did not work.", { code: ["Wrong, expired or already used. Wait for the app's next code and enter it."] });
    }
    if (reason === "locked") throw new AppError("rate_limited", "Too many failed attempts. Sign-in is paused for 15 minutes; you can use an e-mail link meanwhile.");
    throw new AppError("unauthenticated", "That e-mail and password do not match an account.");
  }
  const user = await getUserForSignIn(db, email);
  redirect(safeCallbackPath(callbackUrl) ?? homePathFor(user?.role ?? "client"));
});

/** An e-mailed sign-in link; the answer is the same page whether or not the address has an account. */
export const requestMagicLink = defineFormAction({ access: "public", input: magicLinkSchema }, async ({ email }) => {
  try {
    await signIn("email", { email: email.toLowerCase(), redirect: false, redirectTo: "/after-sign-in" });
  } catch (e) {
    // Say nothing that tells whether the address has an account; log what went wrong.
    if (!(e instanceof AuthError)) throw e;
    rootLogger().error({ event: "auth.link_failed", type: e.type }, "sign-in link request failed");
  }
  redirect("/sign-in/check-email");
});

/** A new client firm and its lead; throttled per e-mail and per address (every attempt counts). */
export const signUp = defineFormAction({ access: "public", input: z.preprocess(nestedFields, signUpSchema) }, async (parsed, { db }) => {
  const input = { ...parsed, email: parsed.email.toLowerCase() };
  // Every attempt counts, so the form cannot be used to try address after address.
  const now = new Date();
  const address = clientAddress(await headers());
  const byEmail = await countAttempt(db, `signup:email:${input.email}`, SIGNUP_EMAIL_RULE, now);
  const byAddress = address ? await countAttempt(db, `signup:addr:${address}`, SIGNUP_ADDRESS_RULE, now) : null;
  if (isOverLimit(byEmail, SIGNUP_EMAIL_RULE) || (byAddress && isOverLimit(byAddress, SIGNUP_ADDRESS_RULE))) {
    throw new AppError("rate_limited", "Too many sign-up attempts. Please wait 15 minutes before trying again.");
  }
  if (await isEmailTaken(db, input.email)) {
    throw new AppError("conflict", "An account with this e-mail already exists. Sign in, or ask your firm's lead to invite you.", { email: ["Already registered."] });
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
    rootLogger().error({ event: "auth.welcome_failed", err: String(e) }, "welcome e-mail failed");
  }
  await signIn("credentials", { email: input.email, password: input.password, redirect: false });
  redirect("/portal");
});

/** Sign out: open to anyone (signing out a missing session changes nothing); ends every copy of the session (lib/auth/sign-out.ts). */
const signOutDoor = defineAction({ access: "public", input: z.unknown() }, async () => {
  await signOut({ redirectTo: "/" });
});

/** The sign-out button's form action (a `<form action>` wants nothing back; a failure is logged by the door). */
export async function signOutAction(formData: FormData): Promise<void> {
  await signOutDoor(formData);
}
