import "server-only";
import { createHash, randomBytes } from "node:crypto";
import { createElement } from "react";
import type { Db } from "@/db/client";
import { countAttempt, getUserForSignIn } from "@/db/queries/auth";
import { consumePasswordResetToken, createPasswordResetToken } from "@/db/queries/password-reset";
import PasswordResetEmail from "@/emails/password-reset";
import type { SendEmailInput } from "@/lib/email/send";
import { hashPassword } from "./password";
import { isOverLimit, type ThrottleRule } from "./throttle";

/** A reset link works for 30 minutes (common practice for account recovery links). */
export const RESET_TTL_MS = 30 * 60_000;
/** Reset requests per e-mail and per address in 15 minutes before further ones are refused (common practice). */
export const RESET_EMAIL_RULE: ThrottleRule = { maxFailures: 3, windowMs: 15 * 60_000, lockMs: 15 * 60_000 };
export const RESET_ADDRESS_RULE: ThrottleRule = { maxFailures: 20, windowMs: 15 * 60_000, lockMs: 15 * 60_000 };

/** SHA-256 of the token, hex: the only form stored. */
export function hashResetToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

/** 32 random bytes, base64url (43 characters). */
export function newResetToken(): string {
  return randomBytes(32).toString("base64url");
}

export type ResetRequestOutcome = "sent_if_known" | "throttled";

/**
 * Ask for a reset link. The outcome is the same whether or not the e-mail has an account; only
 * existing, enabled accounts get a message. Each request counts against the e-mail and the
 * address, known or not.
 */
export async function requestPasswordReset(
  db: Db,
  input: { email: string; address: string | null; appUrl: string; now: Date; send: (msg: SendEmailInput) => void | Promise<unknown> },
): Promise<ResetRequestOutcome> {
  const email = input.email.toLowerCase();
  const emailKey = `reset:email:${email}`;
  // Counted atomically, so parallel requests cannot all pass on one stale count.
  const emailCount = await countAttempt(db, emailKey, RESET_EMAIL_RULE, input.now);
  const addressCount = input.address ? await countAttempt(db, `reset:addr:${input.address}`, RESET_ADDRESS_RULE, input.now) : null;
  if (isOverLimit(emailCount, RESET_EMAIL_RULE) || (addressCount && isOverLimit(addressCount, RESET_ADDRESS_RULE))) return "throttled";

  const user = await getUserForSignIn(db, email);
  if (!user || user.disabledAt) return "sent_if_known";
  const token = newResetToken();
  await createPasswordResetToken(db, { userId: user.id, tokenHash: hashResetToken(token), expiresAt: new Date(input.now.getTime() + RESET_TTL_MS), now: input.now });
  const url = `${input.appUrl.replace(/\/$/, "")}/reset/new?token=${token}`;
  await input.send({
    to: user.email,
    subject: "Reset your Layerwright password",
    react: createElement(PasswordResetEmail, { url, minutes: RESET_TTL_MS / 60_000 }),
    tags: [{ name: "template", value: "password-reset" }],
  });
  return "sent_if_known";
}

/** Set a new password with a token; false when the token is unknown, used or expired. */
export async function completePasswordReset(db: Db, input: { token: string; password: string; now: Date }): Promise<boolean> {
  const passwordHash = await hashPassword(input.password);
  const done = await consumePasswordResetToken(db, { tokenHash: hashResetToken(input.token), passwordHash, now: input.now });
  return done !== null;
}
