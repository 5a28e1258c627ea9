"use server";

import { confirmEnrolment, getTwoFactor, removeTwoFactor, replaceRecoveryCodes } from "@/db/queries/two-factor";
import { hashRecoveryCode, matchTotp, newRecoveryCodes, requiresTwoFactor } from "@/lib/auth/two-factor";
import { AppError } from "@/lib/errors";
import { defineFormAction } from "@/lib/server/define-action";
import { twoFactorCodeSchema } from "@/lib/validation/auth";

const wrongCode = () => new AppError("invalid_input:code", "That code did not work.", { code: ["Wrong or expired. Enter the code the app shows now."] });
/** Every action here reads one code; staff still enrolling may use them (access "enrolling"). */
const spec = { access: "enrolling", input: twoFactorCodeSchema, invalid: "Enter the 6-digit code." } as const;

/** Finish enrolment: a code from the new app proves it is set up; returns the recovery codes, shown once. */
export const confirmTwoFactor = defineFormAction(spec, async ({ code }, { user, db }) => {
  const factor = await getTwoFactor(db, user.id);
  if (!factor || factor.confirmedAt) throw new AppError("conflict:two_factor", "Reload the page to set up the app again.");
  const now = new Date();
  const step = matchTotp(factor.secret, code, now.getTime());
  if (step === null) throw wrongCode();
  const recoveryCodes = newRecoveryCodes();
  const ok = await confirmEnrolment(db, { userId: user.id, step, recoveryHashes: recoveryCodes.map(hashRecoveryCode), now });
  if (!ok) throw new AppError("conflict:two_factor", "Reload the page to set up the app again.");
  return { recoveryCodes };
});

/** New recovery codes (the old ones stop working); asks for a current code first. */
export const renewRecoveryCodes = defineFormAction(spec, async ({ code }, { user, db }) => {
  const factor = await getTwoFactor(db, user.id);
  if (!factor?.confirmedAt) throw new AppError("conflict:two_factor", "Set up the authenticator app first.");
  if (matchTotp(factor.secret, code, Date.now()) === null) throw wrongCode();
  const recoveryCodes = newRecoveryCodes();
  await replaceRecoveryCodes(db, user.id, recoveryCodes.map(hashRecoveryCode));
  return { recoveryCodes };
});

/** Clients may turn the second factor off again (with a current code); staff may not. */
export const turnOffTwoFactor = defineFormAction(spec, async ({ code }, { user, db }) => {
  if (requiresTwoFactor(user.role)) throw new AppError("forbidden:two_factor", "Staff accounts must keep a second factor; an admin can reset it if the phone is lost.");
  const factor = await getTwoFactor(db, user.id);
  if (!factor?.confirmedAt) throw new AppError("conflict:two_factor", "Two-factor sign-in is not on.");
  if (matchTotp(factor.secret, code, Date.now()) === null) throw wrongCode();
  await removeTwoFactor(db, { userId: user.id, actorId: user.id, orgId: user.orgId, reason: "turned_off" });
});
