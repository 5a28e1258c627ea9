import "server-only";
import { getDb } from "@/db/client";
import { bumpSessionVersion } from "@/db/queries/auth";

/**
 * Auth.js's `events.signOut`, reached by every sign-out (the form's action and Auth.js's own
 * `POST /api/auth/signout`): the user's session version moves on, so this session, and any copy
 * of its cookie, is refused by the guard in every process from the next request.
 */
export async function endSessionsOnSignOut(message: { token?: { sub?: string | null } | null } | { session?: unknown }): Promise<void> {
  const sub = "token" in message ? message.token?.sub : undefined;
  if (sub) await bumpSessionVersion(getDb(), sub);
}
