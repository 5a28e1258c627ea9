/**
 * Staff two-factor sign-in: staff without an authenticator app can do nothing until they enrol;
 * enrolment is confirmed by a code and yields one-use recovery codes; a sign-in of an enrolled
 * account needs a fresh code (one use per 30-s step) or an unused recovery code; an admin's reset
 * is audited and sends the member back to enrolment. Clients may turn it on and off.
 */
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { Db } from "../../db/client";
import { auditLog, twoFactor, users } from "../../db/schema";
import { DEMO_TOTP_SECRETS } from "@/lib/seed/data";
import { totpCodeForStep, totpStepAt } from "../../lib/auth/two-factor";
import { createTestDb, type TestDb } from "../helpers/test-db";
import { userIdOf } from "./admin-setup";
import { dbRef, session } from "../support/integration";

vi.mock("@/lib/auth/config", async () => (await import("../support/integration")).authConfigMock);
vi.mock("@/lib/auth/session", async () => (await import("../support/integration")).sessionMock);
vi.mock("@/db/client", async (importOriginal) => (await import("../support/integration")).dbClientMock(importOriginal));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));

let t: TestDb;
let db: Db;

beforeAll(async () => {
  t = await createTestDb({ seeded: true });
  db = t.db;
  dbRef.db = db;
}, 120_000);
afterAll(() => t?.close());

const as = async (email: string) => (session.current = { user: { id: await userIdOf(db, email) } });
const form = (fields: Record<string, string>) => {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) f.set(k, v);
  return f;
};
const codeNow = (secret: string, ahead = 0) => totpCodeForStep(secret, totpStepAt(Date.now()) + ahead);

describe("the guard and enrolment", () => {
  it("seeded demo staff are enrolled and pass the guard", async () => {
    const { requireRole } = await import("@/lib/auth/guard");
    await as("sales@ostrevane.example");
    await expect(requireRole("sales")).resolves.toMatchObject({ role: "sales", hasTwoFactor: true });
  });

  it("staff without an app are refused everywhere but enrolment, then enrol with a code and get 10 recovery codes", async () => {
    const { requirePermission, getSignedInUser } = await import("@/lib/auth/guard");
    const { confirmTwoFactor } = await import("@/app/(auth)/two-factor/actions");
    const [u] = await db.insert(users).values({ email: "new.sales@ostrevane.example", role: "sales", name: "Oren Vale" }).returning({ id: users.id });
    session.current = { user: { id: u!.id } };
    await expect(requirePermission("sales:inbox")).rejects.toMatchObject({ code: "forbidden:two_factor" });
    expect(await getSignedInUser()).toMatchObject({ id: u!.id, hasTwoFactor: false });

    const { startEnrolment, getTwoFactor } = await import("../../db/queries/two-factor");
    const { newTotpSecret } = await import("../../lib/auth/two-factor");
    await startEnrolment(db, u!.id, newTotpSecret());
    const secret = (await getTwoFactor(db, u!.id))!.secret;

    expect(await confirmTwoFactor(null, form({ code: "12345" }))).toMatchObject({ ok: false, code: "invalid_input", fieldErrors: { code: expect.any(Array) } });
    const wrong = codeNow(secret, 5);
    expect(await confirmTwoFactor(null, form({ code: wrong }))).toMatchObject({ ok: false, code: "invalid_input:code" });
    const ok = await confirmTwoFactor(null, form({ code: codeNow(secret) }));
    expect(ok).toMatchObject({ ok: true });
    expect(ok && ok.ok ? ok.data.recoveryCodes : []).toHaveLength(10);
    // A second confirm of the same enrolment is refused (nothing left to confirm).
    expect(await confirmTwoFactor(null, form({ code: codeNow(secret, 1) }))).toMatchObject({ ok: false, code: "conflict:two_factor" });
    await expect(requirePermission("sales:inbox")).resolves.toMatchObject({ id: u!.id });
    const audit = await db.select().from(auditLog).where(and(eq(auditLog.action, "two_factor.enrolled"), eq(auditLog.entityId, u!.id)));
    expect(audit).toHaveLength(1);
  });
});

describe("the sign-in's second step", () => {
  it("asks for a code, takes a fresh one once, refuses it again, and takes each recovery code once", async () => {
    const { checkSecondFactor } = await import("@/lib/auth/second-factor");
    const { replaceRecoveryCodes } = await import("../../db/queries/two-factor");
    const { hashRecoveryCode } = await import("../../lib/auth/two-factor");
    const id = await userIdOf(db, "accounts@ostrevane.example");
    const secret = DEMO_TOTP_SECRETS["accounts@ostrevane.example"]!;
    const now = new Date();
    expect(await checkSecondFactor(db, id, undefined, now)).toBe("missing");
    expect(await checkSecondFactor(db, id, "   ", now)).toBe("missing");
    expect(await checkSecondFactor(db, id, "not a code", now)).toBe("wrong");
    const code = codeNow(secret);
    expect(await checkSecondFactor(db, id, code, now)).toBe("ok");
    expect(await checkSecondFactor(db, id, code, now)).toBe("wrong");
    expect(await checkSecondFactor(db, id, codeNow(secret, 1), now)).toBe("ok");

    await replaceRecoveryCodes(db, id, [hashRecoveryCode("abcde-fghjk")]);
    expect(await checkSecondFactor(db, id, "ABCDE FGHJK", now)).toBe("ok");
    expect(await checkSecondFactor(db, id, "abcde-fghjk", now)).toBe("wrong");
    const used = await db.select().from(auditLog).where(and(eq(auditLog.action, "two_factor.recovery_code_used"), eq(auditLog.entityId, id)));
    expect(used).toHaveLength(1);
  });

  it("a client without an app signs in with the password alone", async () => {
    const { checkSecondFactor, needsCodeToSignIn } = await import("@/lib/auth/second-factor");
    const id = await userIdOf(db, "engineer@caldrith.example");
    expect(await checkSecondFactor(db, id, undefined, new Date())).toBe("none");
    expect(await needsCodeToSignIn(db, { id, role: "client" })).toBe(false);
    expect(await needsCodeToSignIn(db, { id: await userIdOf(db, "admin@ostrevane.example"), role: "admin" })).toBe(true);
  });
});

describe("an admin's reset", () => {
  it("is for admins only, audited, and sends the member back to enrolment", async () => {
    const { resetStaffTwoFactor } = await import("@/app/admin/staff/actions");
    const { getCurrentUser } = await import("@/lib/auth/guard");
    const target = await userIdOf(db, "production@ostrevane.example");
    await as("sales@ostrevane.example");
    expect(await resetStaffTwoFactor({ userId: target })).toMatchObject({ ok: false, code: "forbidden" });
    await as("lead@caldrith.example");
    expect(await resetStaffTwoFactor({ userId: target })).toMatchObject({ ok: false, code: "forbidden" });
    await as("admin@ostrevane.example");
    expect(await resetStaffTwoFactor({ userId: await userIdOf(db, "lead@caldrith.example") })).toMatchObject({ ok: false, code: "not_found:user" });
    expect(await resetStaffTwoFactor({ userId: target })).toMatchObject({ ok: true });
    expect(await resetStaffTwoFactor({ userId: target })).toMatchObject({ ok: false, code: "conflict:not_enrolled" });
    expect(await db.select().from(twoFactor).where(eq(twoFactor.userId, target))).toHaveLength(0);
    const [entry] = await db.select().from(auditLog).where(and(eq(auditLog.action, "two_factor.reset"), eq(auditLog.entityId, target)));
    expect(entry).toMatchObject({ actorId: await userIdOf(db, "admin@ostrevane.example"), before: { enrolled: true }, after: { enrolled: false } });
    session.current = { user: { id: target } };
    expect(await getCurrentUser()).toBeNull();
  });
});

describe("clients", () => {
  it("may turn it on and off again (with a code); staff may not turn it off", async () => {
    const { confirmTwoFactor, turnOffTwoFactor } = await import("@/app/(auth)/two-factor/actions");
    const { startEnrolment, getTwoFactor } = await import("../../db/queries/two-factor");
    const { newTotpSecret } = await import("../../lib/auth/two-factor");
    const id = await userIdOf(db, "buyer@bramblewake.example");
    session.current = { user: { id } };
    await startEnrolment(db, id, newTotpSecret());
    const secret = (await getTwoFactor(db, id))!.secret;
    expect(await confirmTwoFactor(null, form({ code: codeNow(secret) }))).toMatchObject({ ok: true });
    expect(await turnOffTwoFactor(null, form({ code: codeNow(secret, 7) }))).toMatchObject({ ok: false, code: "invalid_input:code" });
    expect(await turnOffTwoFactor(null, form({ code: codeNow(secret) }))).toMatchObject({ ok: true });
    expect(await getTwoFactor(db, id)).toBeNull();

    await as("admin@ostrevane.example");
    expect(await turnOffTwoFactor(null, form({ code: codeNow(DEMO_TOTP_SECRETS["admin@ostrevane.example"]!) }))).toMatchObject({ ok: false, code: "forbidden:two_factor" });
  });
});
