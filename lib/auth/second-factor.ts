import "server-only";
import type { Db } from "@/db/client";
import { getTwoFactor, spendRecoveryCode, spendTotpStep } from "@/db/queries/two-factor";
import type { Role } from "@/db/schema/common";
import { hashRecoveryCode, kindOfCode, matchTotp, requiresTwoFactor } from "./two-factor";

/**
 * The second step of a password sign-in. "none": the account has no confirmed second factor
 * (a client who did not turn it on, or staff who have yet to enrol: the guard then sends them to
 * enrolment before anything else). "ok": a fresh app code or an unused recovery code.
 */
export async function checkSecondFactor(db: Db, userId: string, code: string | undefined, now: Date): Promise<"none" | "ok" | "missing" | "wrong"> {
  const factor = await getTwoFactor(db, userId);
  if (!factor?.confirmedAt) return "none";
  if (!code || !code.trim()) return "missing";
  const kind = kindOfCode(code);
  if (kind === "totp") {
    const step = matchTotp(factor.secret, code, now.getTime(), factor.lastUsedStep);
    return step !== null && (await spendTotpStep(db, userId, step)) ? "ok" : "wrong";
  }
  if (kind === "recovery") return (await spendRecoveryCode(db, userId, hashRecoveryCode(code), now)) ? "ok" : "wrong";
  return "wrong";
}

/** Accounts that may not use e-mail sign-in links (a link would skip the code). */
export async function needsCodeToSignIn(db: Db, user: { id: string; role: Role }): Promise<boolean> {
  if (requiresTwoFactor(user.role)) return true;
  return Boolean((await getTwoFactor(db, user.id))?.confirmedAt);
}
