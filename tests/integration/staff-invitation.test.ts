/**
 * Staff invitations: the admin's invite e-mails a one-time link to the accept page; the invitee
 * sets name and password there and can then sign in with it. Token rules as for password resets:
 * only the SHA-256 is stored, one use, an expiry, a fresh invitation revokes the old link.
 */
import { renderToStaticMarkup } from "react-dom/server";
import { createHash } from "node:crypto";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { Db } from "../../db/client";
import { getUserForSignIn } from "../../db/queries/auth";
import { auditLog, invitations, users } from "../../db/schema";
import { verifyPassword } from "../../lib/auth/password";
import type { SendEmailInput } from "../../lib/email/send";
import { createTestDb, type TestDb } from "../helpers/test-db";
import { interruptOf, userIdOf } from "./admin-setup";
import { dbRef, session } from "../support/integration";

vi.mock("@/lib/auth/config", async () => (await import("../support/integration")).authConfigMock);
vi.mock("@/lib/auth/session", async () => (await import("../support/integration")).sessionMock);
vi.mock("@/db/client", async (importOriginal) => (await import("../support/integration")).dbClientMock(importOriginal));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));
const sent = vi.hoisted(() => [] as SendEmailInput[]);
vi.mock("@/lib/email/send", () => ({ sendEmail: vi.fn(async (m: SendEmailInput) => (sent.push(m), { id: `m${sent.length}` })) }));

let t: TestDb;
let db: Db;
const PASSWORD = "cell-planner-2031";

beforeAll(async () => {
  t = await createTestDb({ seeded: true });
  db = t.db;
  dbRef.db = db;
}, 120_000);
afterAll(() => t?.close());

const asAdmin = async () => (session.current = { user: { id: await userIdOf(db, "admin@ostrevane.example") } });
const signedOut = () => (session.current = null);

/** The token is only in the invitation e-mail's link. */
function linkOf(msg: SendEmailInput | undefined): URL {
  const url = (msg?.react.props as { url?: string } | undefined)?.url;
  if (!url) throw new Error("no link in the invitation e-mail");
  return new URL(url);
}

async function invite(email: string, role = "production") {
  const { inviteStaff } = await import("@/app/admin/staff/actions");
  await asAdmin();
  const before = sent.length;
  const r = await inviteStaff({ email, role });
  signedOut();
  expect(r.ok, JSON.stringify(r)).toBe(true);
  expect(sent.length).toBe(before + 1);
  const link = linkOf(sent.at(-1));
  return { r, link, token: link.searchParams.get("token")! };
}

function form(fields: Record<string, string>) {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) f.set(k, v);
  return f;
}

/** Call the accept action as the browser's form post does; a redirect means it was accepted. */
async function accept(fields: Record<string, string>) {
  const { acceptInvitationAction } = await import("@/app/(auth)/invite/actions");
  try {
    return await acceptInvitationAction(null, form(fields));
  } catch (e) {
    if (interruptOf(e) === "redirect") return "redirected" as const;
    throw e;
  }
}

async function acceptPageHtml(token: string) {
  const { default: Page } = await import("@/app/(auth)/invite/accept/page");
  return renderToStaticMarkup(await Page({ searchParams: Promise.resolve({ token }) })).replace(/<!-- -->/g, "");
}

const userRow = async (email: string) => (await db.select().from(users).where(eq(users.email, email)))[0]!;

describe("staff invitation accept flow", () => {
  it("e-mails a link to the accept page; only the token's SHA-256 is stored", async () => {
    const { link, token } = await invite("new.planner@ostrevane.example");
    expect(link.pathname).toBe("/invite/accept");
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(sent.at(-1)!.to).toBe("new.planner@ostrevane.example");
    const rows = await db.select().from(invitations).where(eq(invitations.email, "new.planner@ostrevane.example"));
    expect(rows).toHaveLength(1);
    expect(rows[0]!.tokenHash).toBe(createHash("sha256").update(token).digest("hex"));
    expect(JSON.stringify(rows)).not.toContain(token);
    const html = await acceptPageHtml(token);
    expect(html).toContain("Join the back office");
    expect(html).toContain("new.planner@ostrevane.example");
    expect(html).toContain("production role");
  });

  it("refuses a weak password or a mismatch with field errors and keeps the link open", async () => {
    const { token } = await invite("weak.password@ostrevane.example", "sales");
    expect(await accept({ token, name: "Tamsin Ivers", password: "short", confirm: "short" })).toMatchObject({ ok: false, code: "invalid_input", fieldErrors: { password: expect.arrayContaining(["Use at least 10 characters."]) } });
    expect(await accept({ token, name: "Tamsin Ivers", password: PASSWORD, confirm: `${PASSWORD}x` })).toMatchObject({ ok: false, fieldErrors: { confirm: ["The two passwords differ."] } });
    expect(await accept({ token, name: "", password: PASSWORD, confirm: PASSWORD })).toMatchObject({ ok: false, fieldErrors: { name: ["Enter your name."] } });
    expect((await userRow("weak.password@ostrevane.example")).passwordHash).toBeNull();
    expect(await acceptPageHtml(token)).toContain("Join the back office");
  });

  it("sets name and password once; the invitee can then sign in with the password", async () => {
    const { token } = await invite("ansel.brook@ostrevane.example");
    expect(await accept({ token, name: "Ansel Brook", password: PASSWORD, confirm: PASSWORD })).toBe("redirected");
    const u = await getUserForSignIn(db, "ansel.brook@ostrevane.example");
    expect(u?.name).toBe("Ansel Brook");
    expect(u?.role).toBe("production");
    // What the credentials provider checks (lib/auth/config.ts): the stored hash against the password.
    expect(await verifyPassword(PASSWORD, u?.passwordHash)).toBe(true);
    expect(await verifyPassword("not-the-password-1", u?.passwordHash)).toBe(false);
    const [inv] = await db.select().from(invitations).where(eq(invitations.email, "ansel.brook@ostrevane.example"));
    expect(inv!.acceptedAt).not.toBeNull();
    expect((await db.select().from(auditLog).where(eq(auditLog.action, "staff.accept_invitation"))).some((a) => a.entityId === u!.id)).toBe(true);

    // Used: a second accept is refused and changes nothing; the page says the link no longer works.
    const hash = u!.passwordHash;
    expect(await accept({ token, name: "Someone Else", password: "other-password-9", confirm: "other-password-9" })).toMatchObject({ ok: false, code: "invalid_input:token", message: expect.stringMatching(/expired or has already been used/) });
    expect((await userRow("ansel.brook@ostrevane.example")).passwordHash).toBe(hash);
    expect((await userRow("ansel.brook@ostrevane.example")).name).toBe("Ansel Brook");
    expect(await acceptPageHtml(token)).toContain("This invitation no longer works");
    // And the address can not be invited again once accepted.
    const { inviteStaff } = await import("@/app/admin/staff/actions");
    await asAdmin();
    expect(await inviteStaff({ email: "ansel.brook@ostrevane.example", role: "sales" })).toMatchObject({ ok: false, code: "conflict:email" });
    signedOut();
  });

  it("an expired link is refused and writes nothing", async () => {
    const { token } = await invite("late.starter@ostrevane.example", "accounts");
    await db.update(invitations).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(invitations.email, "late.starter@ostrevane.example"));
    expect(await accept({ token, name: "Late Starter", password: PASSWORD, confirm: PASSWORD })).toMatchObject({ ok: false, code: "invalid_input:token" });
    expect((await userRow("late.starter@ostrevane.example")).passwordHash).toBeNull();
    const [inv] = await db.select().from(invitations).where(eq(invitations.email, "late.starter@ostrevane.example"));
    expect(inv!.acceptedAt).toBeNull();
    expect(await acceptPageHtml(token)).toContain("This invitation no longer works");
  });

  it("inviting an unaccepted address again sends a fresh link, keeps the role and revokes the old link", async () => {
    const first = await invite("second.try@ostrevane.example", "accounts");
    const again = await invite("second.try@ostrevane.example", "admin");
    expect(again.r).toMatchObject({ ok: true, data: { isResent: true } });
    expect(again.token).not.toBe(first.token);
    expect((await userRow("second.try@ostrevane.example")).role).toBe("accounts");
    expect(await accept({ token: first.token, name: "Second Try", password: PASSWORD, confirm: PASSWORD })).toMatchObject({ ok: false, code: "invalid_input:token" });
    expect(await accept({ token: again.token, name: "Second Try", password: PASSWORD, confirm: PASSWORD })).toBe("redirected");
  });

  it("a disabled account can not accept, and the link stays unused", async () => {
    const { token } = await invite("left.early@ostrevane.example", "sales");
    await db.update(users).set({ disabledAt: new Date() }).where(eq(users.email, "left.early@ostrevane.example"));
    expect(await accept({ token, name: "Left Early", password: PASSWORD, confirm: PASSWORD })).toMatchObject({ ok: false, code: "invalid_input:token" });
    expect((await userRow("left.early@ostrevane.example")).passwordHash).toBeNull();
    const [inv] = await db.select().from(invitations).where(eq(invitations.email, "left.early@ostrevane.example"));
    expect(inv!.acceptedAt).toBeNull();
  });

  it("garbage tokens and no form at all are refused plainly", async () => {
    expect(await accept({ token: "../../etc/passwd", name: "X Y", password: PASSWORD, confirm: PASSWORD })).toMatchObject({ ok: false, code: "invalid_input:token" });
    expect(await accept({ token: "A".repeat(43), name: "X Y", password: PASSWORD, confirm: PASSWORD })).toMatchObject({ ok: false, code: "invalid_input:token" });
    const { acceptInvitationAction } = await import("@/app/(auth)/invite/actions");
    expect(await acceptInvitationAction(null, undefined as unknown as FormData)).toMatchObject({ ok: false, code: "invalid_input:token" });
    expect(await acceptPageHtml("nonsense")).toContain("This invitation no longer works");
  });
});
