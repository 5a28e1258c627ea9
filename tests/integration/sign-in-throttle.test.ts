/**
 * Password sign-in under parallel guessing: attempts are counted atomically before the password
 * is checked, so of 40 simultaneous wrong passwords at most five reach the check and the count
 * loses none; a locked account is refused without a check, even with the right password.
 * Successful sign-ins are not held against their address; no address means no shared key.
 * With a second factor: a right password without its code is not held against anyone, a wrong
 * code counts like a wrong password.
 */
import { eq, like } from "drizzle-orm";
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { signInAttempts } from "../../db/schema";
import type * as PasswordModule from "../../lib/auth/password";
import { DEMO_PASSWORDS, DEMO_TOTP_SECRETS } from "@/lib/seed/data";
import { totpCodeForStep, totpStepAt } from "../../lib/auth/two-factor";
import { createTestDb, type TestDb } from "../helpers/test-db";

const checks = vi.hoisted(() => ({ n: 0 }));
vi.mock("../../lib/auth/password", async (importOriginal) => {
  const real = await importOriginal<typeof PasswordModule>();
  return {
    ...real,
    verifyPassword: async (password: string, hash: string | null | undefined) => {
      checks.n += 1;
      return real.verifyPassword(password, hash);
    },
  };
});
const { checkPasswordSignIn } = await import("../../lib/auth/sign-in");

let t: TestDb;
const NOW = new Date("2026-12-01T12:00:00Z");

beforeAll(async () => {
  t = await createTestDb({ seeded: true, now: NOW });
}, 120_000);
afterAll(() => t?.close());
beforeEach(async () => {
  checks.n = 0;
  await t.db.delete(signInAttempts);
});

const attempt = (email: string, password: string, address: string | null = "198.51.100.4", now = NOW, code?: string) =>
  checkPasswordSignIn(t.db, { email, password, ...(code ? { code } : {}) }, address, now);
const codeAt = (email: string, now: Date) => totpCodeForStep(DEMO_TOTP_SECRETS[email]!, totpStepAt(now.getTime()));

describe("password sign-in throttle", () => {
  it("40 parallel wrong passwords: at most five are checked, every one is counted, the account locks", async () => {
    const results = await Promise.all(Array.from({ length: 40 }, (_, i) => attempt("sales@ostrevane.example", `wrong-${i}`, `198.51.100.${i + 1}`)));
    expect(checks.n).toBeLessThanOrEqual(5);
    expect(results.filter((r) => r.kind === "ok")).toEqual([]);
    expect(results.filter((r) => r.kind === "locked").length).toBeGreaterThanOrEqual(35);
    const [row] = await t.db.select().from(signInAttempts).where(eq(signInAttempts.key, "email:sales@ostrevane.example"));
    expect(row?.failures).toBe(40);
    expect(row?.lockedUntil?.getTime()).toBeGreaterThan(NOW.getTime());

    // Locked: the right password is refused without being checked.
    checks.n = 0;
    expect((await attempt("sales@ostrevane.example", DEMO_PASSWORDS.sales)).kind).toBe("locked");
    expect(checks.n).toBe(0);
    // Fifteen minutes on, the lock has lapsed.
    const later = new Date(NOW.getTime() + 16 * 60_000);
    expect((await attempt("sales@ostrevane.example", DEMO_PASSWORDS.sales, "198.51.100.4", later, codeAt("sales@ostrevane.example", later))).kind).toBe("ok");
  });

  it("an address guessing across many accounts in parallel is stopped at its limit", async () => {
    const results = await Promise.all(Array.from({ length: 60 }, (_, i) => attempt(`nobody${i}@nowhere.example`, "guess", "203.0.113.50")));
    expect(checks.n).toBeLessThanOrEqual(30);
    expect(results.filter((r) => r.kind === "locked").length).toBeGreaterThanOrEqual(30);
    // Another address is not affected.
    expect((await attempt("lead@caldrith.example", DEMO_PASSWORDS.client_admin, "203.0.113.51")).kind).toBe("ok");
  });

  it("successful sign-ins are not throttled: 35 in a row from one address (past its limit of 30) all pass", async () => {
    for (let i = 0; i < 35; i++) expect((await attempt("engineer@caldrith.example", DEMO_PASSWORDS.client, "192.0.2.10")).kind).toBe("ok");
  });

  it("without a known address there is no shared key: one guesser cannot lock everyone out", async () => {
    await Promise.all(Array.from({ length: 40 }, (_, i) => attempt(`x${i}@nowhere.example`, "guess", null)));
    expect(await t.db.select().from(signInAttempts).where(like(signInAttempts.key, "addr:%"))).toEqual([]);
    expect((await attempt("lab@tarnavel.example", DEMO_PASSWORDS.client_admin, null)).kind).toBe("ok");
  });

  it("second factor: a right password without its code is not counted; a wrong code is, and locks like a wrong password", async () => {
    const email = "accounts@ostrevane.example";
    for (let i = 0; i < 8; i++) expect((await attempt(email, DEMO_PASSWORDS.accounts)).kind).toBe("code_required");
    const [afterMissing] = await t.db.select().from(signInAttempts).where(eq(signInAttempts.key, `email:${email}`));
    expect(afterMissing?.failures ?? 0).toBe(0);
    for (let i = 0; i < 5; i++) expect((await attempt(email, DEMO_PASSWORDS.accounts, "198.51.100.4", NOW, "000000")).kind).toBe("code_invalid");
    checks.n = 0;
    expect((await attempt(email, DEMO_PASSWORDS.accounts, "198.51.100.4", NOW, codeAt(email, NOW))).kind).toBe("locked");
    expect(checks.n).toBe(0);
  });
});
