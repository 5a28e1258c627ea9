/**
 * Sign-in throttling, pure: failures counted per key (an e-mail or an address) in a window;
 * past the limit the key is locked for a while. Limits are common practice, not a standard.
 */
export interface ThrottleState {
  failures: number;
  windowStartedAt: Date;
  lockedUntil: Date | null;
}

export interface ThrottleRule {
  maxFailures: number;
  windowMs: number;
  lockMs: number;
}

export const EMAIL_RULE: ThrottleRule = { maxFailures: 5, windowMs: 15 * 60_000, lockMs: 15 * 60_000 };
export const ADDRESS_RULE: ThrottleRule = { maxFailures: 30, windowMs: 15 * 60_000, lockMs: 15 * 60_000 };
/** E-mailed sign-in links per recipient in a quarter hour; past it the answer is the same but no mail goes. */
export const LINK_EMAIL_RULE: ThrottleRule = { maxFailures: 4, windowMs: 15 * 60_000, lockMs: 15 * 60_000 };
/** Sign-ups per network address and per e-mail in a quarter hour (each attempt counts). */
export const SIGNUP_ADDRESS_RULE: ThrottleRule = { maxFailures: 10, windowMs: 15 * 60_000, lockMs: 15 * 60_000 };
export const SIGNUP_EMAIL_RULE: ThrottleRule = { maxFailures: 5, windowMs: 15 * 60_000, lockMs: 15 * 60_000 };

export function isLocked(state: ThrottleState | null, now: Date): boolean {
  return Boolean(state?.lockedUntil && state.lockedUntil > now);
}

/** The state after one more failure. */
export function afterFailure(state: ThrottleState | null, now: Date, rule: ThrottleRule): ThrottleState {
  const fresh = !state || now.getTime() - state.windowStartedAt.getTime() > rule.windowMs;
  const failures = fresh ? 1 : state.failures + 1;
  const windowStartedAt = fresh ? now : state.windowStartedAt;
  const lockedUntil = failures >= rule.maxFailures ? new Date(now.getTime() + rule.lockMs) : null;
  return { failures, windowStartedAt, lockedUntil };
}

/** Whether an attempt counted as `state.failures` is past the rule's limit (so is refused unchecked). */
export function isOverLimit(state: ThrottleState, rule: ThrottleRule): boolean {
  return state.failures > rule.maxFailures;
}
