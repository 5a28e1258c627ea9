import { authenticator } from "otplib";
import { createHash, randomBytes, timingSafeEqual } from "node:crypto";
import type { Role } from "@/db/schema/common";
import { isStaff } from "./policy";

/** RFC 6238 defaults, which every authenticator app reads: 30-s steps, 6 digits, HMAC-SHA1. */
export const TOTP_STEP_S = 30;
/** Codes from one step either side of now are accepted (clock drift; RFC 6238 §5.2 recommends at most one). */
const WINDOW_STEPS = 1;
export const ISSUER = "Layerwright";
export const RECOVERY_CODE_COUNT = 10;

/** Staff must use a second factor; clients may. */
export function requiresTwoFactor(role: Role): boolean {
  return isStaff(role);
}

/** A new shared secret, base32 (20 random bytes, the length RFC 4226 §4 recommends). */
export function newTotpSecret(): string {
  return authenticator.generateSecret(20);
}

/** The otpauth:// URI an authenticator app reads from the enrolment QR code. */
export function totpUri(email: string, secret: string): string {
  return authenticator.keyuri(email, ISSUER, secret);
}

export function totpStepAt(nowMs: number): number {
  return Math.floor(nowMs / 1000 / TOTP_STEP_S);
}

/** The code for one time step. */
export function totpCodeForStep(secret: string, step: number): string {
  return authenticator.clone({ epoch: step * TOTP_STEP_S * 1000 }).generate(secret);
}

const sameText = (a: string, b: string) => a.length === b.length && timingSafeEqual(Buffer.from(a), Buffer.from(b));

/**
 * The time step a typed code belongs to, or null. Steps at or before `lastUsedStep` are refused,
 * so one code (seen over a shoulder, or replayed) signs in only once.
 */
export function matchTotp(secret: string, code: string, nowMs: number, lastUsedStep: number | null = null): number | null {
  const typed = code.replace(/\s+/g, "");
  if (!/^\d{6}$/.test(typed)) return null;
  const now = totpStepAt(nowMs);
  let found: number | null = null;
  // Check every step in the window (no early exit), so timing says nothing of which matched.
  for (let step = now - WINDOW_STEPS; step <= now + WINDOW_STEPS; step++) {
    if (sameText(totpCodeForStep(secret, step), typed) && (lastUsedStep === null || step > lastUsedStep)) found ??= step;
  }
  return found;
}

/** Recovery codes as shown to the user once: 10 groups like "k7q2m-9xw4d" (50 bits each). */
export function newRecoveryCodes(count = RECOVERY_CODE_COUNT): string[] {
  const alphabet = "abcdefghjkmnpqrstuvwxyz23456789"; // no 0/o, 1/l/i
  return Array.from({ length: count }, () => {
    const bytes = randomBytes(10);
    const chars = Array.from(bytes, (b) => alphabet[b % alphabet.length]).join("");
    return `${chars.slice(0, 5)}-${chars.slice(5)}`;
  });
}

/** What is stored for a recovery code: SHA-256 of its normalised form (case, spaces and dashes ignored). */
export function hashRecoveryCode(code: string): string {
  return createHash("sha256").update(normaliseRecoveryCode(code)).digest("hex");
}

export function normaliseRecoveryCode(code: string): string {
  return code.toLowerCase().replace(/[\s-]+/g, "");
}

/** A typed second factor: six digits is an app code; ten letters and digits is a recovery code. */
export function kindOfCode(code: string): "totp" | "recovery" | null {
  if (/^\d{6}$/.test(code.replace(/\s+/g, ""))) return "totp";
  if (/^[a-z0-9]{10}$/.test(normaliseRecoveryCode(code))) return "recovery";
  return null;
}
