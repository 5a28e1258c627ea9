/**
 * The integration tests' shared stand-ins: the signed-in user and the test database take the place
 * of Auth.js's session and the app's database. A test file wires them in with vi.mock factories
 * that import this module (vi.mock is hoisted above imports, so a factory imports what it needs),
 * and imports the same `session` and `dbRef` to set them: one module, one state, per test file.
 *
 *     import { dbRef, session } from "../support/integration";
 *     vi.mock("@/lib/auth/config", async () => (await import("../support/integration")).authConfigMock);
 *     vi.mock("@/lib/auth/session", async () => (await import("../support/integration")).sessionMock);
 *     vi.mock("@/db/client", async (importOriginal) => (await import("../support/integration")).dbClientMock(importOriginal));
 */

/** Who is signed in (null: nobody). */
export const session = { current: null as null | { user: { id: string } } };

/** The database the app's `getDb()` answers with (set in beforeAll). */
export const dbRef = { db: null as unknown };

/** `@/lib/auth/config`: Auth.js's `auth()` answers the session above. */
export const authConfigMock = { auth: async () => session.current };

/** `@/lib/auth/session`: a seeded user's token at session version 0, or none. */
export const sessionMock = {
  currentSession: async () => (session.current?.user?.id ? { userId: session.current.user.id, sessionVersion: 0 } : null),
};

/** `@/db/client`: the real module, with `getDb()` answering the test database. */
export async function dbClientMock(importOriginal: <T = unknown>() => Promise<T>) {
  return { ...(await importOriginal<object>()), getDb: () => dbRef.db };
}

/** `next/cache`: revalidation has no cache to clear outside a server. */
export const nextCacheMock = { revalidatePath: () => {}, revalidateTag: () => {} };
