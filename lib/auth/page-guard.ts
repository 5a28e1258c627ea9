import "server-only";
import { forbidden, notFound, redirect } from "next/navigation";
import type { Role } from "@/db/schema/common";
import { isAppError } from "@/lib/errors";
import { getSignedInUser, mustEnrolTwoFactor, type CurrentUser } from "./guard";
import { hasPermission, type Permission } from "./policy";

/**
 * Page-level wrappers around the guard: signed out → sign-in, wrong role → 403 page,
 * not visible → 404 page. Pages call these; actions and handlers call guard.ts directly.
 */
export async function pageUser(next?: string): Promise<CurrentUser> {
  const user = await getSignedInUser();
  if (!user) redirect(next ? `/sign-in?callbackUrl=${encodeURIComponent(next)}` : "/sign-in");
  // Staff set up their second factor before anything else.
  if (mustEnrolTwoFactor(user)) redirect(next ? `/two-factor?callbackUrl=${encodeURIComponent(next)}` : "/two-factor");
  return user;
}

export async function pageRole(roles: Role[], next?: string): Promise<CurrentUser> {
  const user = await pageUser(next);
  if (!roles.includes(user.role)) forbidden();
  return user;
}

export async function pagePermission(permission: Permission, next?: string): Promise<CurrentUser> {
  const user = await pageUser(next);
  if (!hasPermission(user, permission)) forbidden();
  return user;
}

/** Run a lookup that may throw AppError; map it to the page's 404/403. */
export async function orPageError<T>(fn: () => Promise<T>): Promise<T> {
  try {
    return await fn();
  } catch (e) {
    if (isAppError(e)) {
      if (e.kind === "not_found") notFound();
      if (e.kind === "forbidden") forbidden();
      if (e.kind === "unauthenticated") redirect("/sign-in");
    }
    throw e;
  }
}
