import "server-only";
import { cache } from "react";
import { getDb } from "@/db/client";
import { getSessionUser } from "@/db/queries/auth";
import type { Role } from "@/db/schema/common";
import { AppError } from "@/lib/errors";
import { canOpenFiles, canSee, hasPermission, type Permission, type PolicyResource, type PolicyUser } from "./policy";
import { currentSession } from "./session";
import { requiresTwoFactor } from "./two-factor";

export interface CurrentUser extends PolicyUser {
  name: string | null;
  email: string;
  unitsPref: "mm" | "in";
  /** Has a confirmed second factor (authenticator app). */
  hasTwoFactor: boolean;
}

/**
 * Who is signed in, loaded fresh from the database (cached for the request), whether or not they
 * have finished setting up what their role requires. Null when signed out, disabled, or when the
 * session's version is no longer the user's (signed out elsewhere, password reset, role changed,
 * removed). Only the enrolment page and its actions use this directly; everything else goes
 * through `getCurrentUser`.
 */
export const getSignedInUser = cache(async (): Promise<CurrentUser | null> => {
  const session = await currentSession();
  if (!session) return null;
  const row = await getSessionUser(getDb(), session.userId);
  if (!row || row.disabledAt || row.sessionVersion !== session.sessionVersion) return null;
  return {
    id: row.id,
    name: row.name,
    email: row.email,
    role: row.role,
    orgId: row.orgId ?? null,
    isControlledCleared: row.isControlledCleared,
    unitsPref: row.unitsPref,
    hasTwoFactor: Boolean(row.twoFactorConfirmedAt),
  };
});

/** Staff who signed in with a password but have not set up their second factor yet. */
export function mustEnrolTwoFactor(user: CurrentUser): boolean {
  return requiresTwoFactor(user.role) && !user.hasTwoFactor;
}

/**
 * The one server-side choke point: who is signed in, or null when signed out, disabled, or staff
 * still without a second factor (who may do nothing until they enrol; pages send them there).
 */
export const getCurrentUser = cache(async (): Promise<CurrentUser | null> => {
  const user = await getSignedInUser();
  return user && !mustEnrolTwoFactor(user) ? user : null;
});

export async function requireUser(): Promise<CurrentUser> {
  const user = await getSignedInUser();
  if (!user) throw new AppError("unauthenticated", "Please sign in.");
  if (mustEnrolTwoFactor(user)) throw new AppError("forbidden:two_factor", "Set up two-factor sign-in first (/two-factor).");
  return user;
}

export async function requireRole(...roles: Role[]): Promise<CurrentUser> {
  const user = await requireUser();
  if (!roles.includes(user.role)) throw new AppError("forbidden", "Your role does not give access to this.");
  return user;
}

export async function requirePermission(permission: Permission): Promise<CurrentUser> {
  const user = await requireUser();
  if (!hasPermission(user, permission)) throw new AppError("forbidden", "Your role does not give access to this.");
  return user;
}

/** Organisation scope: another firm's record answers 404, never 403, so its existence stays hidden. */
export function assertCanSee(user: PolicyUser, resource: PolicyResource | null | undefined, what = "record"): asserts resource is PolicyResource {
  if (!resource || !canSee(user, resource)) throw new AppError(`not_found:${what}`, `That ${what} was not found.`);
}

export function assertCanOpenFiles(user: PolicyUser, resource: PolicyResource | null | undefined, what = "file"): asserts resource is PolicyResource {
  if (!resource || !canOpenFiles(user, resource)) throw new AppError(`not_found:${what}`, `That ${what} was not found.`);
}

/** The client firm this user acts for; an account outside any firm (staff) is refused. */
export function firmOf(user: Pick<PolicyUser, "orgId">): string {
  if (!user.orgId) throw new AppError("forbidden", "Your account is not part of a client firm.");
  return user.orgId;
}
