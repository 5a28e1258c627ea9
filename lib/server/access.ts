import "server-only";
import { getSignedInUser, requirePermission, requireUser, type CurrentUser } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";
import type { Permission } from "@/lib/auth/policy";

/**
 * Who may come through a door, named in its wrapper call so a reader sees the rule at the first line.
 * - a permission (`"quote:manage"`): signed in, and the role holds it (lib/auth/policy.ts);
 * - `"signed-in"`: any signed-in user; the handler scopes by the record (`assertCanSee`, `canOpenFiles`…);
 * - `"enrolling"`: signed in, staff who have not set up their second factor yet included (the
 *   two-factor enrolment and its actions, nothing else);
 * - `"public"`: no session (sign-in, sign-up, password reset, invitation tokens);
 * - `"signature"`: no session; the caller proves itself by a signature the handler checks (webhooks).
 */
export type Access = Permission | "signed-in" | "enrolling" | "public" | "signature";

/** The user a handler receives for each kind of access: none on public and signature-checked doors. */
export type UserFor<A extends Access> = A extends "public" | "signature" ? null : CurrentUser;

/** Step 2 of every door: the guard, through lib/auth/guard.ts. */
export async function enter<A extends Access>(access: A): Promise<UserFor<A>> {
  if (access === "public" || access === "signature") return null as UserFor<A>;
  if (access === "signed-in") return (await requireUser()) as UserFor<A>;
  if (access === "enrolling") {
    const user = await getSignedInUser();
    if (!user) throw new AppError("unauthenticated", "Please sign in.");
    return user as UserFor<A>;
  }
  return (await requirePermission(access)) as UserFor<A>;
}
