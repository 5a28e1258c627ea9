"use server";

import { getDb } from "@/db/client";
import { confirmEnrolment, getTwoFactor, removeTwoFactor, replaceRecoveryCodes } from "@/db/queries/two-factor";
import { getSignedInUser } from "@/lib/auth/guard";
import { hashRecoveryCode, matchTotp, newRecoveryCodes, requiresTwoFactor } from "@/lib/auth/two-factor";
import { AppError, toActionError, type ActionResult } from "@/lib/errors";
import { twoFactorCodeSchema } from "@/lib/validation/auth";
import { fieldErrorsOf } from "@/lib/validation/form";

type CodesResult = ActionResult<{ recoveryCodes: string[] }> | null;
type PlainResult = ActionResult<undefined> | null;

const formEntries = (formData: unknown) => (formData instanceof FormData ? Object.fromEntries(formData) : {});

/** The signed-in user (staff who still have to enrol included); nobody else may use these actions. */
async function signedIn() {
  const user = await getSignedInUser();
  if (!user) throw new AppError("unauthenticated", "Please sign in.");
  return user;
}

function parseCode(formData: unknown): string {
  const parsed = twoFactorCodeSchema.safeParse(formEntries(formData));
  if (!parsed.success) throw new AppError("invalid_input", "Enter the 6-digit code.", fieldErrorsOf(parsed.error));
  return parsed.data.code;
}

const wrongCode = () => new AppError("invalid_input:code", "That code did not work.", { code: ["Wrong or expired. Enter the code the app shows now."] });

/** Finish enrolment: a code from the new app proves it is set up; returns the recovery codes, shown once. */
export async function confirmTwoFactor(_prev: CodesResult, formData: FormData): Promise<CodesResult> {
  try {
    const code = parseCode(formData);
    const user = await signedIn();
    const db = getDb();
    const factor = await getTwoFactor(db, user.id);
    if (!factor || factor.confirmedAt) throw new AppError("conflict:two_factor", "Reload the page to set up the app again.");
    const now = new Date();
    const step = matchTotp(factor.secret, code, now.getTime());
    if (step === null) throw wrongCode();
    const recoveryCodes = newRecoveryCodes();
    const ok = await confirmEnrolment(db, { userId: user.id, step, recoveryHashes: recoveryCodes.map(hashRecoveryCode), now });
    if (!ok) throw new AppError("conflict:two_factor", "Reload the page to set up the app again.");
    return { ok: true, data: { recoveryCodes } };
  } catch (e) {
    return toActionError(e);
  }
}

/** New recovery codes (the old ones stop working); asks for a current code first. */
export async function renewRecoveryCodes(_prev: CodesResult, formData: FormData): Promise<CodesResult> {
  try {
    const code = parseCode(formData);
    const user = await signedIn();
    const db = getDb();
    const factor = await getTwoFactor(db, user.id);
    if (!factor?.confirmedAt) throw new AppError("conflict:two_factor", "Set up the authenticator app first.");
    if (matchTotp(factor.secret, code, Date.now()) === null) throw wrongCode();
    const recoveryCodes = newRecoveryCodes();
    await replaceRecoveryCodes(db, user.id, recoveryCodes.map(hashRecoveryCode));
    return { ok: true, data: { recoveryCodes } };
  } catch (e) {
    return toActionError(e);
  }
}

/** Clients may turn the second factor off again (with a current code); staff may not. */
export async function turnOffTwoFactor(_prev: PlainResult, formData: FormData): Promise<PlainResult> {
  try {
    const code = parseCode(formData);
    const user = await signedIn();
    if (requiresTwoFactor(user.role)) throw new AppError("forbidden:two_factor", "Staff accounts must keep a second factor; an admin can reset it if the phone is lost.");
    const db = getDb();
    const factor = await getTwoFactor(db, user.id);
    if (!factor?.confirmedAt) throw new AppError("conflict:two_factor", "Two-factor sign-in is not on.");
    if (matchTotp(factor.secret, code, Date.now()) === null) throw wrongCode();
    await removeTwoFactor(db, { userId: user.id, actorId: user.id, orgId: user.orgId, reason: "turned_off" });
    return { ok: true, data: undefined };
  } catch (e) {
    return toActionError(e);
  }
}
