import { eq, like } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "../../db/client";
import { getUserForSignIn } from "../../db/queries/auth";
import { passwordResetTokens, signInAttempts } from "../../db/schema";
import { completePasswordReset, hashResetToken, requestPasswordReset, RESET_TTL_MS } from "../../lib/auth/password-reset";
import { verifyPassword } from "../../lib/auth/password";
import type { SendEmailInput } from "../../lib/email/send";
import { createTestDb, type TestDb } from "../helpers/test-db";

let t: TestDb;
let db: Db;
const sent: SendEmailInput[] = [];
const NOW = new Date("2026-12-01T12:00:00Z");
const at = (ms: number) => new Date(NOW.getTime() + ms);

beforeAll(async () => {
  t = await createTestDb({ seeded: true, now: NOW });
  db = t.db;
});
afterAll(() => t?.close());

async function ask(email: string, now = NOW, address = "203.0.113.7") {
  const before = sent.length;
  const outcome = await requestPasswordReset(db, { email, address, appUrl: "http://localhost:3000", now, send: (m) => void sent.push(m) });
  const msg = sent.length > before ? sent[sent.length - 1] : undefined;
  return { outcome, msg };
}

/** The token is only in the link of the sent e-mail. */
function tokenOf(msg: SendEmailInput | undefined): string {
  const props = msg?.react.props as { url?: string } | undefined;
  const token = props?.url ? new URL(props.url).searchParams.get("token") : null;
  if (!token) throw new Error("no reset link in the e-mail");
  return token;
}

describe("password reset", () => {
  it("answers the same for an unknown e-mail and sends nothing", async () => {
    const r = await ask("nobody@nowhere.example");
    expect(r.outcome).toBe("sent_if_known");
    expect(r.msg).toBeUndefined();
  });

  it("stores only the token's SHA-256, and the link sets a new password once", async () => {
    const { outcome, msg } = await ask("engineer@caldrith.example");
    expect(outcome).toBe("sent_if_known");
    expect(msg?.to).toBe("engineer@caldrith.example");
    const token = tokenOf(msg);
    const rows = await db.select().from(passwordResetTokens);
    expect(rows.some((r) => r.tokenHash === token)).toBe(false);
    const row = rows.find((r) => r.tokenHash === hashResetToken(token));
    expect(row?.expiresAt.getTime()).toBe(NOW.getTime() + RESET_TTL_MS);

    expect(await completePasswordReset(db, { token, password: "new-password-2027", now: at(60_000) })).toBe(true);
    const user = await getUserForSignIn(db, "engineer@caldrith.example");
    expect(await verifyPassword("new-password-2027", user?.passwordHash)).toBe(true);
    expect(await verifyPassword("demo-client-2026", user?.passwordHash)).toBe(false);

    // Single use: the same token again is refused and changes nothing.
    expect(await completePasswordReset(db, { token, password: "another-password-1", now: at(120_000) })).toBe(false);
    const again = await getUserForSignIn(db, "engineer@caldrith.example");
    expect(again?.passwordHash).toBe(user?.passwordHash);
  });

  it("two concurrent uses of one token: exactly one wins", async () => {
    const token = tokenOf((await ask("lab@tarnavel.example", NOW, "203.0.113.20")).msg);
    const results = await Promise.all([
      completePasswordReset(db, { token, password: "first-password-1", now: at(1000) }),
      completePasswordReset(db, { token, password: "second-password-2", now: at(1000) }),
    ]);
    expect(results.filter(Boolean)).toHaveLength(1);
  });

  it("expires after 30 minutes", async () => {
    const token = tokenOf((await ask("buyer@bramblewake.example", NOW, "203.0.113.8")).msg);
    expect(await completePasswordReset(db, { token, password: "late-password-1", now: at(RESET_TTL_MS + 1) })).toBe(false);
    const user = await getUserForSignIn(db, "buyer@bramblewake.example");
    expect(await verifyPassword("demo-lead-2026", user?.passwordHash)).toBe(true);
  });

  it("a newer link replaces the older one", async () => {
    const first = tokenOf((await ask("lead@caldrith.example", NOW, "203.0.113.9")).msg);
    const second = tokenOf((await ask("lead@caldrith.example", at(1000), "203.0.113.9")).msg);
    expect(await completePasswordReset(db, { token: first, password: "older-link-pass-1", now: at(2000) })).toBe(false);
    expect(await completePasswordReset(db, { token: second, password: "newer-link-pass-1", now: at(2000) })).toBe(true);
  });

  it("a made-up token is refused", async () => {
    expect(await completePasswordReset(db, { token: "A".repeat(43), password: "guessed-pass-1", now: NOW })).toBe(false);
  });

  it("throttles per e-mail (known or not) and per address", async () => {
    for (const email of ["sales@ostrevane.example", "ghost@nowhere.example"]) {
      const outcomes = [];
      for (let i = 0; i < 4; i++) outcomes.push((await ask(email, at(i * 1000), `198.51.100.${i}`)).outcome);
      expect(outcomes).toEqual(["sent_if_known", "sent_if_known", "sent_if_known", "throttled"]);
      // The lock lifts after its 15 minutes.
      expect((await ask(email, at(16 * 60_000), "198.51.100.99")).outcome).toBe("sent_if_known");
    }
    const perAddress = [];
    for (let i = 0; i < 21; i++) perAddress.push((await ask(`someone${i}@nowhere.example`, NOW, "192.0.2.50")).outcome);
    expect(perAddress.slice(0, 20).every((o) => o === "sent_if_known")).toBe(true);
    expect(perAddress[20]).toBe("throttled");
    const locks = await db.select().from(signInAttempts).where(like(signInAttempts.key, "reset:%"));
    expect(locks.length).toBeGreaterThan(0);
  });

  it("a disabled account gets no link", async () => {
    const { users } = await import("../../db/schema");
    await db.update(users).set({ disabledAt: NOW }).where(eq(users.email, "accounts@ostrevane.example"));
    const r = await ask("accounts@ostrevane.example", NOW, "203.0.113.30");
    expect(r.outcome).toBe("sent_if_known");
    expect(r.msg).toBeUndefined();
  });
});
