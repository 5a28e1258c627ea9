import { cookies } from "next/headers";
import { auth } from "./config";
import { SessionCache, sessionTokenFrom } from "./session-cache";

/** Tokens Auth.js verified in the last 30 s in this process (session-cache.ts says what that trades). */
const verified = new SessionCache({ ttlMs: Number(process.env.SESSION_CACHE_TTL_MS ?? 30_000), maxEntries: 10_000 });

/**
 * The signed-in user's id from the session cookie, or null. Auth.js verifies each token (and
 * re-issues it where the response can carry a cookie) at most once per token per 30 s; the guard
 * loads the user's row fresh on every request either way.
 */
export async function sessionUserId(): Promise<string | null> {
  const token = sessionTokenFrom((await cookies()).getAll());
  if (!token) return null;
  const now = Date.now();
  const known = verified.get(token, now);
  if (known !== undefined) return known;
  const session = await auth();
  const id = session?.user?.id ?? null;
  verified.set(token, id, now);
  return id;
}
