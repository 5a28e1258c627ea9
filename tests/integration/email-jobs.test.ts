/**
 * E-mails as durable jobs: a failed send is kept and tried again with back-off until the e-mail
 * API takes it (with the same idempotency key each time); a refusal that cannot change, or too
 * many attempts, ends `failed` for staff to send again; nothing is dropped.
 */
import { createHash } from "node:crypto";
import { eq } from "drizzle-orm";
import { createElement } from "react";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "../../db/client";
import { emailBacklog, listUndeliveredEmails } from "../../db/queries/email-jobs";
import { emailJobs, emailOutbox } from "../../db/schema";
import WelcomeEmail from "../../emails/welcome";
import { emailBackoffMs, MAX_EMAIL_ATTEMPTS, queueEmail, resendFailedEmail, sweepEmails } from "../../lib/email/outbox";
import { EmailSendError, type RenderedEmail } from "../../lib/email/send";
import { createTestDb, type TestDb } from "../helpers/test-db";

let t: TestDb;
let db: Db;
beforeAll(async () => {
  t = await createTestDb();
  db = t.db;
}, 120_000);
afterAll(() => t?.close());

const mail = (key: string) => ({
  to: "lead@caldrith.example",
  subject: "Welcome to Layerwright",
  react: createElement(WelcomeEmail, { name: "Jonah", firmName: "Caldrith Aerostructures", portalUrl: "http://localhost/portal" }),
  idempotencyKey: key,
});
const jobOf = async (id: string) => (await db.select().from(emailJobs).where(eq(emailJobs.id, id)))[0]!;

/** An e-mail API that fails `failures` times (network), then accepts; records what it was sent. */
function flakyApi(failures: number, error = () => new EmailSendError("connect ECONNREFUSED", "network_error", null)) {
  const calls: RenderedEmail[] = [];
  return {
    calls,
    send: async (m: RenderedEmail) => {
      calls.push(m);
      if (calls.length <= failures) throw error();
      return { id: `msg-${calls.length}` };
    },
  };
}

describe("durable e-mails", () => {
  it("sends at once when the API answers", async () => {
    const api = flakyApi(0);
    const r = await queueEmail(mail("k-ok"), db, { send: api.send });
    expect(r.sent).toBe(true);
    expect(await jobOf(r.jobId)).toMatchObject({ status: "sent", attempts: 1, providerId: "msg-1" });
    expect(api.calls[0]!.text).toContain("Caldrith Aerostructures");
  });

  it("keeps a failed send and retries it with back-off, with the same idempotency key, until it goes", async () => {
    const api = flakyApi(2);
    let now = new Date("2027-03-01T09:00:00Z");
    const clock = () => now;
    const r = await queueEmail(mail("k-flaky"), db, { send: api.send, now: clock });
    expect(r.sent).toBe(false);
    const first = await jobOf(r.jobId);
    expect(first).toMatchObject({ status: "queued", attempts: 1, lastError: expect.stringContaining("ECONNREFUSED") });
    expect(first.nextAttemptAt!.getTime() - now.getTime()).toBe(emailBackoffMs(1));

    // Not yet due: nothing happens.
    expect((await sweepEmails(db, { send: api.send, now: clock })).attempted).toBe(0);
    now = new Date(now.getTime() + emailBackoffMs(1));
    expect(await sweepEmails(db, { send: api.send, now: clock })).toEqual({ attempted: 1, sent: 0 });
    expect((await jobOf(r.jobId)).nextAttemptAt!.getTime() - now.getTime()).toBe(emailBackoffMs(2));
    expect(await emailBacklog(db)).toMatchObject({ waiting: 1 });
    now = new Date(now.getTime() + emailBackoffMs(2));
    expect(await sweepEmails(db, { send: api.send, now: clock })).toEqual({ attempted: 1, sent: 1 });
    expect(await jobOf(r.jobId)).toMatchObject({ status: "sent", attempts: 3 });
    expect(new Set(api.calls.map((c) => c.idempotencyKey))).toEqual(new Set(["k-flaky"]));
  });

  it("an attachment is kept with the job and sent whole on the retry; the outbox records its name, size and hash", async () => {
    const api = flakyApi(1);
    let now = new Date("2027-03-02T09:00:00Z");
    const clock = () => now;
    // Bytes that are not valid UTF-8, so a text round trip would change them.
    const pdf = Buffer.from([0x25, 0x50, 0x44, 0x46, 0x2d, 0xff, 0xfe, 0x00, 0x80, 0x0a]);
    const r = await queueEmail({ ...mail("k-attached"), attachments: [{ filename: "INV-2027-00001.pdf", content: pdf, contentType: "application/pdf" }] }, db, { send: api.send, now: clock });
    expect(r.sent).toBe(false);
    now = new Date(now.getTime() + emailBackoffMs(1));
    expect(await sweepEmails(db, { send: api.send, now: clock })).toEqual({ attempted: 1, sent: 1 });
    expect(api.calls).toHaveLength(2);
    for (const c of api.calls) {
      expect(c.attachments).toHaveLength(1);
      expect(c.attachments![0]).toMatchObject({ filename: "INV-2027-00001.pdf", contentType: "application/pdf" });
      expect(Buffer.compare(c.attachments![0]!.content, pdf)).toBe(0);
    }
    const [copy] = await db.select().from(emailOutbox).where(eq(emailOutbox.providerId, "msg-2"));
    expect(copy!.attachments).toEqual([{ filename: "INV-2027-00001.pdf", contentType: "application/pdf", sizeBytes: pdf.length, sha256: createHash("sha256").update(pdf).digest("hex") }]);
  });

  it("a refusal that cannot change fails at once; staff send it again", async () => {
    const refused = flakyApi(1, () => new EmailSendError("invalid to address", "validation_error", 422));
    const r = await queueEmail(mail("k-refused"), db, { send: refused.send });
    expect(await jobOf(r.jobId)).toMatchObject({ status: "failed", attempts: 1 });
    const undelivered = await listUndeliveredEmails(db);
    expect(undelivered.find((u) => u.id === r.jobId)).toMatchObject({ status: "failed", subject: "Welcome to Layerwright" });
    expect(undelivered[0]).not.toHaveProperty("html");
    expect(await resendFailedEmail(db, r.jobId, { send: refused.send })).toEqual({ reset: true, sent: true });
    expect(await jobOf(r.jobId)).toMatchObject({ status: "sent", attempts: 1 });
    expect(await resendFailedEmail(db, r.jobId, { send: refused.send })).toEqual({ reset: false, sent: false });
  });

  it(`gives up after ${MAX_EMAIL_ATTEMPTS} attempts and shows it failed`, async () => {
    const down = flakyApi(1000);
    let now = new Date("2027-04-01T09:00:00Z");
    const r = await queueEmail(mail("k-down"), db, { send: down.send, now: () => now });
    for (let i = 1; i < MAX_EMAIL_ATTEMPTS; i++) {
      now = new Date(now.getTime() + emailBackoffMs(i));
      await sweepEmails(db, { send: down.send, now: () => now });
    }
    expect(await jobOf(r.jobId)).toMatchObject({ status: "failed", attempts: MAX_EMAIL_ATTEMPTS });
    expect(down.calls).toHaveLength(MAX_EMAIL_ATTEMPTS);
    expect(await emailBacklog(db)).toMatchObject({ failed: 1 });
  });

  it("a send interrupted mid-attempt (process died) is taken over once its lease ends", async () => {
    const never = { send: () => new Promise<{ id: string }>(() => {}) };
    const now = new Date("2027-05-01T09:00:00Z");
    void queueEmail(mail("k-died"), db, { send: never.send, now: () => now });
    await new Promise((r) => setTimeout(r, 300));
    const [job] = await db.select().from(emailJobs).where(eq(emailJobs.idempotencyKey, "k-died"));
    expect(job).toMatchObject({ status: "sending" });
    const api = flakyApi(0);
    expect((await sweepEmails(db, { send: api.send, now: () => now })).attempted).toBe(0);
    expect(await sweepEmails(db, { send: api.send, now: () => new Date(now.getTime() + 61_000) })).toEqual({ attempted: 1, sent: 1 });
  });
});
