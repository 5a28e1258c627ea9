import "server-only";
import { cookies } from "next/headers";
import { auth } from "./config";
import { SessionCache, sessionTokenFrom } from "./session-cache";

/** Who a session cookie names: the user and the session version it was signed in at. */
export interface SessionIdentity {
  userId: string;
  sessionVersion: number;
}

/** Tokens Auth.js verified in the last 30 s in this process (session-cache.ts says what that trades). */
const verified = new SessionCache<SessionIdentity | null>({ ttlMs: Number(process.env.SESSION_CACHE_TTL_MS ?? 30_000), maxEntries: 10_000 });

/**
 * The session cookie's user and session version, or null. Auth.js verifies each token (and
 * re-issues it where the response can carry a cookie) at most once per token per 30 s; the guard
 * loads the user's row fresh on every request either way and compares the session version.
 */
export async function currentSession(): Promise<SessionIdentity | null> {
  const token = sessionTokenFrom((await cookies()).getAll());
  if (!token) return null;
  const now = Date.now();
  const known = verified.get(token, now);
  if (known !== undefined) return known;
  const session = await auth();
  const identity = session?.user?.id ? { userId: session.user.id, sessionVersion: session.sessionVersion } : null;
  verified.set(token, identity, now);
  return identity;
}

/** The signed-in user's id from the session cookie, or null (the guard also checks the version). */
export async function sessionUserId(): Promise<string | null> {
  return (await currentSession())?.userId ?? null;
}
