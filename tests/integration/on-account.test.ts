import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { Db } from "../../db/client";
import { auditLog, documents, issuedDocuments, orders, organisations, payments, quotes, requests, stageEvents, uploads, users } from "../../db/schema";
import { createTestDb, type TestDb } from "../helpers/test-db";
import { dbRef, session } from "../support/integration";

vi.mock("@/lib/auth/config", async () => (await import("../support/integration")).authConfigMock);
vi.mock("@/lib/auth/session", async () => (await import("../support/integration")).sessionMock);
vi.mock("@/db/client", async (importOriginal) => (await import("../support/integration")).dbClientMock(importOriginal));
vi.mock("next/cache", async () => (await import("../support/integration")).nextCacheMock);
vi.mock("@/lib/email/notify", () => ({ notifyShipped: async () => {}, notifyBalanceDue: async () => {}, notifyScheduled: async () => {}, notifyRequestReceived: async () => {}, notifyDepositReceived: async () => {} }));
// Paying the deposit by card is covered by portal-flow; here the payment page must only not be reached on account.
const checkout = vi.hoisted(() => ({ calls: 0 }));
vi.mock("@/lib/payments/checkout", () => ({ openCheckout: async () => (checkout.calls++, { url: "http://pay.local/x", isComplete: false }) }));
// The invoice on terms goes out without transfer details when the processor does not answer.
vi.mock("@/lib/payments/bank-transfer", () => ({ openBankTransfer: async () => { throw new Error("no processor in this test"); } }));

let t: TestDb;
let db: Db;
const DAY = 86_400_000;

beforeAll(async () => {
  t = await createTestDb({ seeded: true, now: new Date() });
  db = t.db;
  dbRef.db = db;
}, 180_000);
afterAll(() => t?.close());

const as = async (email: string) => {
  const [u] = await db.select({ id: users.id }).from(users).where(eq(users.email, email));
  session.current = { user: { id: u!.id } };
  return u!.id;
};
const firm = async (slug: string) => (await db.select().from(organisations).where(eq(organisations.slug, slug)))[0]!;

/** The quoted demo request, made acceptable again (no order, stage quoted, quote issued). */
async function freshQuote() {
  const [r] = await db.select().from(requests).where(eq(requests.projectName, "Deck hatch plug"));
  const [q] = await db.select().from(quotes).where(eq(quotes.requestId, r!.id));
  await db.delete(issuedDocuments).where(eq(issuedDocuments.requestId, r!.id));
  const [o] = await db.select().from(orders).where(eq(orders.requestId, r!.id));
  if (o) await db.delete(payments).where(eq(payments.orderId, o.id));
  await db.delete(orders).where(eq(orders.requestId, r!.id));
  await db.delete(documents).where(eq(documents.requestId, r!.id));
  await db.delete(stageEvents).where(and(eq(stageEvents.requestId, r!.id)));
  await db.update(requests).set({ stage: "quoted" }).where(eq(requests.id, r!.id));
  await db.update(quotes).set({ status: "issued", acceptedAt: null, acceptedById: null, validUntil: new Date(Date.now() + 20 * DAY) }).where(eq(quotes.id, q!.id));
  return { r: r!, q: q! };
}

async function setTermsAs(email: string, input: { orgId: string; paymentTerms: string; creditLimitCents: number }) {
  await as(email);
  const { setTerms } = await import("../../app/admin/accounts/terms/actions");
  return setTerms(input);
}

describe("the demo", () => {
  it("holds an order on net terms with a PO, a deposit paid by bank transfer, a firm with two ship-tos and a tax-exempt firm's invoice", async () => {
    const rows = await db.select({ project: requests.projectName, o: orders }).from(orders).innerJoin(requests, eq(requests.id, orders.requestId));
    const by = (p: string) => rows.find((r) => r.project === p)!.o;
    const tensile = by("Tensile coupon layup plate");
    expect(tensile).toMatchObject({ paymentTerms: "net45", depositCents: 0, poNumber: expect.stringMatching(/^TPL-PO-\d+$/) });
    expect(Math.round((tensile.dueAt!.getTime() - tensile.invoicedAt!.getTime()) / DAY)).toBeGreaterThanOrEqual(45);
    const [inv] = await db.select().from(issuedDocuments).where(and(eq(issuedDocuments.sourceId, tensile.id), eq(issuedDocuments.kind, "invoice")));
    expect(inv!.data).toMatchObject({ paymentTerms: "Net 45", dueAt: tensile.dueAt!.toISOString(), taxNote: expect.stringMatching(/^No tax charged: the buyer holds tax-exemption certificate EX-5512-0471/) });
    expect(by("Stiffener drill jig")).toMatchObject({ paymentTerms: "net30", depositCents: 0 });
    const sandwich = by("Sandwich panel press fixture");
    const [dep] = await db.select().from(payments).where(and(eq(payments.orderId, sandwich.id), eq(payments.kind, "deposit")));
    expect(dep).toMatchObject({ method: "bank_transfer", status: "paid", receivedCents: dep!.amountCents });
    const [depInv] = await db.select().from(issuedDocuments).where(and(eq(issuedDocuments.sourceId, dep!.id), eq(issuedDocuments.kind, "deposit_invoice")));
    expect(depInv!.data).toMatchObject({ paidBy: "bank transfer", paymentReference: dep!.transferReference });
    const bw = await firm("bramblewake-boatworks");
    const { listAddresses } = await import("../../db/queries/addresses");
    expect((await listAddresses(db, bw.id, "shipping")).map((a) => a.label).sort()).toEqual(["Gulf yard", "North yard"]);
  });
});

describe("net terms, set by accounts", () => {
  it("only accounts (and admin) set terms; net terms need a limit; each change is audited", async () => {
    const bw = await firm("bramblewake-boatworks");
    expect(await setTermsAs("sales@ostrevane.example", { orgId: bw.id, paymentTerms: "net30", creditLimitCents: 5_000_000 })).toMatchObject({ ok: false, code: "forbidden" });
    expect(await setTermsAs("buyer@bramblewake.example", { orgId: bw.id, paymentTerms: "net30", creditLimitCents: 5_000_000 })).toMatchObject({ ok: false, code: "forbidden" });
    const noLimit = await setTermsAs("accounts@ostrevane.example", { orgId: bw.id, paymentTerms: "net30", creditLimitCents: 0 });
    expect(noLimit).toMatchObject({ ok: false, code: "invalid_input" });
    if (!noLimit.ok) expect(noLimit.fieldErrors?.creditLimitCents?.[0]).toMatch(/credit limit above zero/);
    expect((await firm("bramblewake-boatworks")).paymentTerms).toBe("prepay");
    expect(await setTermsAs("accounts@ostrevane.example", { orgId: "nope", paymentTerms: "net30", creditLimitCents: 100 })).toMatchObject({ ok: false, code: "not_found:firm" });
    const accounts = await as("accounts@ostrevane.example");
    expect(await setTermsAs("accounts@ostrevane.example", { orgId: bw.id, paymentTerms: "net45", creditLimitCents: 5_000_000 })).toMatchObject({ ok: true });
    const after = await firm("bramblewake-boatworks");
    expect(after).toMatchObject({ paymentTerms: "net45", creditLimitCents: 5_000_000, termsApprovedById: accounts });
    const [audit] = await db.select().from(auditLog).where(and(eq(auditLog.action, "org.terms"), eq(auditLog.entityId, bw.id)));
    expect(audit!.before).toMatchObject({ paymentTerms: "prepay" });
    expect(audit!.after).toMatchObject({ paymentTerms: "net45", creditLimitCents: 5_000_000 });
  });
});

describe("accepting on account", () => {
  it("a firm on prepay can not choose the account; nothing is accepted", async () => {
    const { r, q } = await freshQuote();
    const bw = await firm("bramblewake-boatworks");
    await setTermsAs("accounts@ostrevane.example", { orgId: bw.id, paymentTerms: "prepay", creditLimitCents: 0 });
    await as("buyer@bramblewake.example");
    const { acceptQuote } = await import("../../app/(portal)/portal/(member)/requests/[id]/actions");
    expect(await acceptQuote({ quoteId: q.id, poNumber: "BW-9001", acceptTerms: true, payBy: "account" })).toMatchObject({ ok: false, code: "conflict:terms" });
    expect(await db.select().from(orders).where(eq(orders.requestId, r.id))).toHaveLength(0);
  });

  it("over the credit limit (open on account + this order) is refused with the figures; the quote stays open and card still works", async () => {
    const { r, q } = await freshQuote();
    const bw = await firm("bramblewake-boatworks");
    await setTermsAs("accounts@ostrevane.example", { orgId: bw.id, paymentTerms: "net30", creditLimitCents: q.totalCents - 1 });
    await as("buyer@bramblewake.example");
    const { acceptQuote } = await import("../../app/(portal)/portal/(member)/requests/[id]/actions");
    const res = await acceptQuote({ quoteId: q.id, poNumber: "BW-9002", acceptTerms: true, payBy: "account" });
    expect(res).toMatchObject({ ok: false, code: "conflict:credit_limit" });
    if (!res.ok) {
      expect(res.message).toMatch(/past its credit limit/);
      expect(res.message).toMatch(/card or bank transfer/);
      expect(res.fieldErrors?.payBy?.[0]).toMatch(/Over your credit limit by \$0\.01/);
    }
    expect(await db.select().from(orders).where(eq(orders.requestId, r.id))).toHaveLength(0);
    expect((await db.select().from(requests).where(eq(requests.id, r.id)))[0]!.stage).toBe("quoted");
    expect((await db.select().from(quotes).where(eq(quotes.id, q.id)))[0]!.status).toBe("issued");
    const before = checkout.calls;
    const card = await acceptQuote({ quoteId: q.id, poNumber: "BW-9002", acceptTerms: true, payBy: "card" });
    expect(card.ok, card.ok ? "" : card.message).toBe(true);
    expect(checkout.calls).toBe(before + 1);
    const [order] = await db.select().from(orders).where(eq(orders.requestId, r.id));
    expect(order).toMatchObject({ paymentTerms: "prepay" });
    expect(order!.depositCents).toBeGreaterThan(0);
  });

  it("refuses a PO file that is not the user's own upload or not a PDF; nothing is accepted", async () => {
    const { r, q } = await freshQuote();
    const bw = await firm("bramblewake-boatworks");
    await setTermsAs("accounts@ostrevane.example", { orgId: bw.id, paymentTerms: "net30", creditLimitCents: 100_000_000 });
    const lead = await as("lead@caldrith.example");
    const [theirs] = await db.insert(uploads).values({ fileKey: "k-theirs", fileName: "po.pdf", sizeBytes: 10, url: "http://x/f/k", contentType: "application/pdf", userId: lead, purpose: "attachment" }).returning();
    const buyer = await as("buyer@bramblewake.example");
    const [notPdf] = await db.insert(uploads).values({ fileKey: "k-png", fileName: "po.png", sizeBytes: 10, url: "http://x/f/k2", contentType: "image/png", userId: buyer, purpose: "attachment" }).returning();
    const { acceptQuote } = await import("../../app/(portal)/portal/(member)/requests/[id]/actions");
    expect(await acceptQuote({ quoteId: q.id, poNumber: "BW-9003", acceptTerms: true, payBy: "account", poUploadId: theirs!.id })).toMatchObject({ ok: false, code: "invalid_input", fieldErrors: { poUploadId: ["Upload the PDF again."] } });
    expect(await acceptQuote({ quoteId: q.id, poNumber: "BW-9003", acceptTerms: true, payBy: "account", poUploadId: notPdf!.id })).toMatchObject({ ok: false, code: "invalid_input", message: "The purchase order must be a PDF." });
    expect(await db.select().from(orders).where(eq(orders.requestId, r.id))).toHaveLength(0);
  });

  it("an approved firm within its limit accepts on its PO with the PDF: no deposit, no payment page, the order proceeds", async () => {
    const { r, q } = await freshQuote();
    const bw = await firm("bramblewake-boatworks");
    await setTermsAs("accounts@ostrevane.example", { orgId: bw.id, paymentTerms: "net30", creditLimitCents: q.totalCents });
    const buyer = await as("buyer@bramblewake.example");
    const [po] = await db.insert(uploads).values({ fileKey: "k-po", fileName: "BW-9004.pdf", sizeBytes: 2048, url: "http://x/f/po", contentType: "application/pdf", userId: buyer, purpose: "attachment" }).returning();
    const before = checkout.calls;
    const { acceptQuote } = await import("../../app/(portal)/portal/(member)/requests/[id]/actions");
    const res = await acceptQuote({ quoteId: q.id, poNumber: "BW-9004", acceptTerms: true, payBy: "account", poUploadId: po!.id });
    expect(res.ok, res.ok ? "" : res.message).toBe(true);
    if (res.ok) expect(res.data.url).toBeNull();
    expect(checkout.calls).toBe(before);
    const [order] = await db.select().from(orders).where(eq(orders.requestId, r.id));
    expect(order).toMatchObject({ paymentTerms: "net30", depositCents: 0, balanceCents: order!.totalCents, poNumber: "BW-9004", poUploadId: po!.id, dueAt: null });
    expect((await db.select().from(requests).where(eq(requests.id, r.id)))[0]!.stage).toBe("deposit_paid");
    const events = await db.select().from(stageEvents).where(eq(stageEvents.requestId, r.id));
    expect(events.map((e) => e.toStage)).toEqual(["accepted", "deposit_paid"]);
    expect(events[1]!.note).toMatch(/On account \(Net 30\), PO BW-9004: no deposit/);
    const [doc] = await db.select().from(documents).where(and(eq(documents.requestId, r.id), eq(documents.kind, "attachment")));
    expect(doc).toMatchObject({ title: "Purchase order BW-9004", fileName: "BW-9004.pdf" });
    const { openOnAccountCents } = await import("../../db/queries/account-terms");
    expect(await openOnAccountCents(db, bw.id)).toBe(order!.totalCents);
  });

  it("ships with an invoice dated on the terms; reminded before the due date, flagged overdue after, each once", async () => {
    const [order] = await db.select().from(orders).innerJoin(requests, eq(requests.id, orders.requestId)).where(eq(requests.projectName, "Deck hatch plug"));
    const o = order!.orders;
    await db.update(requests).set({ stage: "packed" }).where(eq(requests.id, o.requestId));
    await db.update(orders).set({ carrier: "Ridgeline Freight", trackingNumber: "RF-1" }).where(eq(orders.id, o.id));
    await as("production@ostrevane.example");
    const { moveStage } = await import("../../app/admin/production/actions");
    const t0 = Date.now();
    const moved = await moveStage({ orderId: o.id, to: "shipped" });
    expect(moved.ok, moved.ok ? "" : moved.message).toBe(true);
    const [after] = await db.select().from(orders).where(eq(orders.id, o.id));
    expect(after!.invoicedAt!.getTime()).toBeGreaterThanOrEqual(t0 - 1000);
    // Net 30: by the end of the thirtieth calendar day after the invoice date (UTC, as documents print days).
    const inv0 = after!.invoicedAt!;
    expect(after!.dueAt!.toISOString()).toBe(new Date(Date.UTC(inv0.getUTCFullYear(), inv0.getUTCMonth(), inv0.getUTCDate() + 30, 23, 59, 59, 999)).toISOString());
    const [inv] = await db.select().from(issuedDocuments).where(and(eq(issuedDocuments.sourceId, o.id), eq(issuedDocuments.kind, "invoice")));
    const data = inv!.data;
    expect(data).toMatchObject({ paymentTerms: "Net 30", dueAt: after!.dueAt!.toISOString(), balanceDueCents: o.totalCents, poNumber: "BW-9004" });
    expect(data.dueText).toMatch(/^Due by \d{1,2} \w{3} \d{4} \(Net 30: 30 days from the invoice date\), on your purchase order BW-9004\.$/);
    expect(data.deposit).toMatchObject({ amountCents: 0 });

    const { runTermsNotices } = await import("../../lib/payments/dunning");
    const sent: string[] = [];
    const send = async (id: string, which: string) => void (id === o.id && sent.push(`${which}:${id}`));
    // The demo holds other invoices on terms (one already overdue): look at this one.
    const runTermsNoticesFor = async (at: Date) => {
      const r = await runTermsNotices(db, at, send);
      return { reminders: r.reminders.filter((id) => id === o.id), overdue: r.overdue.filter((id) => id === o.id) };
    };
    expect(await runTermsNoticesFor(new Date(after!.dueAt!.getTime() - 10 * DAY))).toEqual({ reminders: [], overdue: [] });
    expect(await runTermsNoticesFor(new Date(after!.dueAt!.getTime() - 2 * DAY))).toEqual({ reminders: [o.id], overdue: [] });
    expect(await runTermsNoticesFor(new Date(after!.dueAt!.getTime() - 1 * DAY))).toEqual({ reminders: [], overdue: [] });
    expect(await runTermsNoticesFor(new Date(after!.dueAt!.getTime() + 3 * DAY))).toEqual({ reminders: [], overdue: [o.id] });
    expect(await runTermsNoticesFor(new Date(after!.dueAt!.getTime() + 4 * DAY))).toEqual({ reminders: [], overdue: [] });
    expect(sent).toEqual([`reminder:${o.id}`, `overdue:${o.id}`]);
    const flagged = await db.select().from(auditLog).where(and(eq(auditLog.action, "invoice.overdue"), eq(auditLog.entityId, o.id)));
    expect(flagged).toHaveLength(1);
    const { listTermsInvoices } = await import("../../db/queries/account-terms");
    const [row] = (await listTermsInvoices(db)).filter((i) => i.orderId === o.id);
    expect(row).toMatchObject({ isPaid: false, owedCents: o.totalCents, invoiceNumber: inv!.number });
  }, 60_000);
});
