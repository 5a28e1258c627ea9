/**
 * Sessions that really end: the guard compares the session's version with the user's on every
 * request, behind the 30 s token memory (lib/auth/session.ts runs for real here, with Auth.js's
 * verification counted), so sign-out, a password reset, a role change and a removal end every
 * session of that user at once, in this process and any other.
 */
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import type { Db } from "../../db/client";
import { users } from "../../db/schema";
import type { SendEmailInput } from "../../lib/email/send";
import { createTestDb, type TestDb } from "../helpers/test-db";
import { userIdOf } from "./admin-setup";
import { dbRef } from "../support/integration";

/** Auth.js's view of each cookie: whose it is and the version it was signed in at. */
const tokens = vi.hoisted(() => ({ byCookie: new Map<string, { id: string; sv: number }>(), current: "", verified: 0 }));
vi.mock("next/headers", () => ({
  cookies: async () => ({ getAll: () => (tokens.current ? [{ name: "authjs.session-token", value: tokens.current }] : []) }),
  headers: async () => new Headers(),
}));
vi.mock("@/lib/auth/config", () => ({
  auth: async () => {
    tokens.verified += 1;
    const t = tokens.byCookie.get(tokens.current);
    return t ? { user: { id: t.id }, sessionVersion: t.sv, expires: "" } : null;
  },
}));
vi.mock("@/db/client", async (importOriginal) => (await import("../support/integration")).dbClientMock(importOriginal));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));

let t: TestDb;
let db: Db;
const NOW = new Date("2026-12-01T12:00:00Z");

beforeAll(async () => {
  t = await createTestDb({ seeded: true, now: NOW });
  db = t.db;
  dbRef.db = db;
}, 120_000);
afterAll(() => t?.close());
beforeEach(() => {
  tokens.verified = 0;
});

const versionOf = async (id: string) => (await db.select({ v: users.sessionVersion }).from(users).where(eq(users.id, id)))[0]!.v;

/** Sign `email` in: a fresh cookie carrying the user's current version. */
async function signedIn(email: string): Promise<string> {
  const id = await userIdOf(db, email);
  const cookie = `cookie-${email}-${Math.random()}`;
  tokens.byCookie.set(cookie, { id, sv: await versionOf(id) });
  return cookie;
}

async function whoIs(cookie: string): Promise<string | null> {
  tokens.current = cookie;
  const { getCurrentUser } = await import("../../lib/auth/guard");
  return (await getCurrentUser())?.email ?? null;
}

describe("a session ends everywhere, through the token memory", () => {
  it("sign-out (Auth.js's signOut event, however it is reached) ends the copied cookie at once", async () => {
    const cookie = await signedIn("buyer@bramblewake.example");
    expect(await whoIs(cookie)).toBe("buyer@bramblewake.example");
    expect(await whoIs(cookie)).toBe("buyer@bramblewake.example");
    expect(tokens.verified).toBe(1); // the second request came from the token memory
    const { endSessionsOnSignOut } = await import("../../lib/auth/sign-out");
    await endSessionsOnSignOut({ token: { sub: tokens.byCookie.get(cookie)!.id } });
    expect(await whoIs(cookie)).toBeNull();
    expect(tokens.verified).toBe(1); // refused although the token memory still knew it
    // Signing in again gives a session that works.
    expect(await whoIs(await signedIn("buyer@bramblewake.example"))).toBe("buyer@bramblewake.example");
  });

  it("a password reset ends every earlier session of the user", async () => {
    const { completePasswordReset, requestPasswordReset } = await import("../../lib/auth/password-reset");
    const phone = await signedIn("engineer@caldrith.example");
    const laptop = await signedIn("engineer@caldrith.example");
    expect(await whoIs(phone)).toBe("engineer@caldrith.example");
    const sent: SendEmailInput[] = [];
    await requestPasswordReset(db, { email: "engineer@caldrith.example", address: null, appUrl: "http://app.test", now: new Date(), send: (m) => void sent.push(m) });
    const url = (sent[0]!.react.props as { url: string }).url;
    expect(await completePasswordReset(db, { token: new URL(url).searchParams.get("token")!, password: "a-new-password-2027", now: new Date() })).toBe(true);
    expect(await whoIs(phone)).toBeNull();
    expect(await whoIs(laptop)).toBeNull();
  });

  it("a role change ends the member's sessions; the admin's own goes on", async () => {
    const admin = await signedIn("admin@ostrevane.example");
    const sales = await signedIn("sales@ostrevane.example");
    expect(await whoIs(sales)).toBe("sales@ostrevane.example");
    tokens.current = admin;
    const { updateStaff } = await import("../../app/admin/staff/actions");
    expect(await updateStaff({ userId: await userIdOf(db, "sales@ostrevane.example"), role: "production" })).toMatchObject({ ok: true });
    expect(await whoIs(sales)).toBeNull();
    expect(await whoIs(admin)).toBe("admin@ostrevane.example");
    // A change of clearance alone keeps the session (it is read fresh on every request anyway).
    const production = await signedIn("production@ostrevane.example");
    tokens.current = admin;
    expect(await updateStaff({ userId: await userIdOf(db, "production@ostrevane.example"), isControlledCleared: true })).toMatchObject({ ok: true });
    expect(await whoIs(production)).toBe("production@ostrevane.example");
  });

  it("removal from a firm ends the member's sessions", async () => {
    const lead = await signedIn("lead@caldrith.example");
    const member = await signedIn("engineer@caldrith.example");
    expect(await whoIs(member)).toBe("engineer@caldrith.example");
    tokens.current = lead;
    const { removeMember } = await import("../../app/(portal)/portal/(member)/firm/actions");
    expect(await removeMember({ userId: await userIdOf(db, "engineer@caldrith.example") })).toMatchObject({ ok: true });
    expect(await whoIs(member)).toBeNull();
    expect(await whoIs(lead)).toBe("lead@caldrith.example");
  });
});
