/**
 * A staff message on a request's thread e-mails the clients on it, through the real Resend SDK
 * and the e-mail fake writing the outbox (as the other notices do). A controlled request's
 * notice says only that there is a new message, with the link.
 */
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { Db } from "../../db/client";
import { emailOutbox, messages, requests, users } from "../../db/schema";
import { resetEnvCache } from "../../lib/env";
import { resetResendClient } from "../../lib/email/send";
import { startResendFake, type ResendFake } from "../../mocks/resend/server";
import { createTestDb, type TestDb } from "../helpers/test-db";
import { userIdOf } from "./admin-setup";
import { dbRef, session } from "../support/integration";

vi.mock("@/lib/auth/config", async () => (await import("../support/integration")).authConfigMock);
vi.mock("@/lib/auth/session", async () => (await import("../support/integration")).sessionMock);
vi.mock("@/db/client", async (importOriginal) => (await import("../support/integration")).dbClientMock(importOriginal));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));

let t: TestDb;
let db: Db;
let resend: ResendFake;

beforeAll(async () => {
  t = await createTestDb({ seeded: true });
  db = t.db;
  dbRef.db = db;
  resend = await startResendFake({
    port: 0,
    // The app writes what the e-mail API accepted to its own outbox.
    store: () => {},
    log: () => {},
  });
  Object.assign(process.env, { RESEND_BASE_URL: resend.url, APP_URL: "http://app.test" });
  resetEnvCache();
  resetResendClient();
  session.current = { user: { id: await userIdOf(db, "sales@ostrevane.example") } };
}, 120_000);
afterAll(async () => {
  await resend?.close();
  t?.close();
});

const norm = (s: string | null) => (s ?? "").replace(/<!-- -->/g, "").replace(/\s+/g, " ");
const mailsTo = async (subject: string) => db.select().from(emailOutbox).where(eq(emailOutbox.subject, subject));

/** A Caldrith request made by the engineer (a plain client), controlled or not. */
async function caldrithRequest(isControlled: boolean) {
  const engineer = await userIdOf(db, "engineer@caldrith.example");
  const [r] = await db.select().from(requests).where(and(eq(requests.createdById, engineer), eq(requests.isControlled, isControlled)));
  if (!r) throw new Error(`seed has no ${isControlled ? "controlled" : "plain"} request by the Caldrith engineer`);
  return r;
}

describe("staff message notice", () => {
  it("goes to the request's creator and every client who posted on the thread, with the message", async () => {
    const { postStaffMessage } = await import("@/app/admin/sales/actions");
    const r = await caldrithRequest(false);
    // The firm's lead joined the thread, so they hear of the reply too.
    await db.insert(messages).values({ requestId: r.id, orgId: r.orgId, authorId: await userIdOf(db, "lead@caldrith.example"), body: "Adding our buyer's view.", isFromStaff: false });
    const body = "The flange now fits the Long Bed with 140 mm to spare.\nCould you confirm the 3 mm finish allowance?";
    const res = await postStaffMessage({ requestId: r.id, body });
    expect(res.ok).toBe(true);

    const rows = await mailsTo(`New message on ${r.reference}`);
    expect(rows).toHaveLength(1);
    const mail = rows[0]!;
    expect(mail.toAddresses.sort()).toEqual(["engineer@caldrith.example", "lead@caldrith.example"]);
    expect(mail.tags).toEqual([{ name: "template", value: "staff-message" }]);
    expect(norm(mail.text)).toContain("The flange now fits the Long Bed with 140 mm to spare.");
    expect(norm(mail.text)).toContain(r.projectName);
    expect(mail.html).toContain(`http://app.test/portal/requests/${r.id}`);
  });

  it("leaves out disabled clients and never writes to staff", async () => {
    const { postStaffMessage } = await import("@/app/admin/sales/actions");
    const r = await caldrithRequest(false);
    await db.update(users).set({ disabledAt: new Date() }).where(eq(users.email, "lead@caldrith.example"));
    try {
      await db.delete(emailOutbox);
      expect((await postStaffMessage({ requestId: r.id, body: "Second note from sales." })).ok).toBe(true);
      const [mail] = await mailsTo(`New message on ${r.reference}`);
      expect(mail!.toAddresses).toEqual(["engineer@caldrith.example"]);
    } finally {
      await db.update(users).set({ disabledAt: null }).where(eq(users.email, "lead@caldrith.example"));
    }
  });

  it("for a controlled request carries no body: only that there is a new message, and the link", async () => {
    const { postStaffMessage } = await import("@/app/admin/sales/actions");
    const r = await caldrithRequest(true);
    const secret = "Bore pattern B-7 moves 12 mm outboard per the customer's drawing rev C";
    expect((await postStaffMessage({ requestId: r.id, body: secret })).ok).toBe(true);
    const [mail] = await mailsTo(`New message on ${r.reference}`);
    expect(mail, "a notice was sent").toBeDefined();
    for (const part of [mail!.html, mail!.text, mail!.subject]) {
      expect(norm(part)).not.toContain("Bore pattern");
      expect(norm(part)).not.toContain("12 mm outboard");
    }
    expect(norm(mail!.text)).toContain("posted a new message");
    expect(norm(mail!.text)).toContain("flagged controlled");
    expect(mail!.html).toContain(`http://app.test/portal/requests/${r.id}`);
    // The message itself is on the thread in full.
    const [stored] = await db.select().from(messages).where(and(eq(messages.requestId, r.id), eq(messages.body, secret)));
    expect(stored?.isFromStaff).toBe(true);
  });

  it("cuts a very long message in the e-mail and points to the request page", async () => {
    const n = await import("@/lib/email/notify");
    const { postStaffMessage } = await import("@/app/admin/sales/actions");
    const r = await caldrithRequest(false);
    await db.delete(emailOutbox);
    const long = `${"Stepover notes. ".repeat(200)}END-OF-MESSAGE`;
    expect((await postStaffMessage({ requestId: r.id, body: long })).ok).toBe(true);
    const [mail] = await mailsTo(`New message on ${r.reference}`);
    expect(norm(mail!.text)).not.toContain("END-OF-MESSAGE");
    expect(norm(mail!.text)).toContain("read all of it on the request page");
    expect(n.MESSAGE_EXCERPT_CHARS).toBeLessThan(long.length);
  });
});
