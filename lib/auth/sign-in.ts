import "server-only";
import { z } from "zod";
import type { Db } from "@/db/client";
import { clearThrottle, countAttempt, getThrottle, getUserForSignIn, uncountAttempt } from "@/db/queries/auth";
import { verifyPassword } from "./password";
import { checkSecondFactor } from "./second-factor";
import { ADDRESS_RULE, EMAIL_RULE, isLocked, isOverLimit } from "./throttle";

const credentialsSchema = z.object({
  email: z.email().max(320),
  password: z.string().min(1).max(200),
  code: z.string().max(40).optional(),
});

export type PasswordSignIn =
  | { kind: "ok"; user: { id: string; email: string; name: string | null } }
  | { kind: "invalid" }
  | { kind: "locked" }
  /** Password right; the account has a second factor and no code came with it. */
  | { kind: "code_required" }
  /** Password right; the code was wrong, already used, or not a code. */
  | { kind: "code_invalid" };

/**
 * Password sign-in (and its second factor) with per-e-mail and per-address throttling; says
 * nothing of whether the e-mail exists. The attempt is counted (atomically) before the password
 * is checked, so of many parallel guesses only those within the limit ever reach the password
 * check, and a locked key never does. A wrong code stays counted like a wrong password, so six
 * digits can not be guessed at leisure. A success clears the e-mail's count and takes its attempt
 * back from the address; so does a right password that still needs its code (the form then asks
 * for it, and that second round is the one that counts).
 */
export async function checkPasswordSignIn(db: Db, raw: unknown, address: string | null, now: Date): Promise<PasswordSignIn> {
  const parsed = credentialsSchema.safeParse(raw);
  if (!parsed.success) return { kind: "invalid" };
  const email = parsed.data.email.toLowerCase();
  const emailKey = `email:${email}`;
  const addressKey = address ? `addr:${address}` : null;
  const [emailBefore, addressBefore] = await Promise.all([getThrottle(db, emailKey), addressKey ? getThrottle(db, addressKey) : null]);
  if (isLocked(emailBefore, now) || isLocked(addressBefore, now) || (addressBefore && isOverLimit(addressBefore, ADDRESS_RULE) && now.getTime() - addressBefore.windowStartedAt.getTime() <= ADDRESS_RULE.windowMs)) {
    return { kind: "locked" };
  }

  const emailCount = await countAttempt(db, emailKey, EMAIL_RULE, now);
  // The address is only counted, never locked outright: sign-ins that succeed are taken back, so
  // many people behind one address are not shut out by attempts that were still in flight.
  const addressCount = addressKey ? await countAttempt(db, addressKey, ADDRESS_RULE, now, { lock: false }) : null;
  if (isOverLimit(emailCount, EMAIL_RULE) || (addressCount && isOverLimit(addressCount, ADDRESS_RULE))) return { kind: "locked" };

  const user = await getUserForSignIn(db, email);
  const ok = await verifyPassword(parsed.data.password, user?.passwordHash);
  if (!ok || !user || user.disabledAt) return { kind: "invalid" };
  const secondFactor = await checkSecondFactor(db, user.id, parsed.data.code, now);
  if (secondFactor === "wrong") return { kind: "code_invalid" };
  if (secondFactor === "missing") {
    await uncountAttempt(db, emailKey);
    if (addressKey) await uncountAttempt(db, addressKey);
    return { kind: "code_required" };
  }
  await clearThrottle(db, emailKey);
  if (addressKey) await uncountAttempt(db, addressKey);
  return { kind: "ok", user: { id: user.id, email: user.email, name: user.name } };
}
