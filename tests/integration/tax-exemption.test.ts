import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { Db } from "../../db/client";
import { documents, issuedDocuments, orders, organisations, payments, quotes, requests, stageEvents, taxExemptions, uploads, users } from "../../db/schema";
import { createTestDb, type TestDb } from "../helpers/test-db";
import { dbRef, session } from "../support/integration";

vi.mock("@/lib/auth/config", async () => (await import("../support/integration")).authConfigMock);
vi.mock("@/lib/auth/session", async () => (await import("../support/integration")).sessionMock);
vi.mock("@/db/client", async (importOriginal) => (await import("../support/integration")).dbClientMock(importOriginal));
vi.mock("next/cache", async () => (await import("../support/integration")).nextCacheMock);
vi.mock("@/lib/email/notify", () => ({ notifyRequestReceived: async () => {}, notifyDepositReceived: async () => {} }));
vi.mock("@/lib/payments/checkout", () => ({ openCheckout: async () => ({ url: null, isComplete: false }) }));

let t: TestDb;
let db: Db;
const DAY = 86_400_000;
const TAX_BP = 825;

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
const bw = async () => (await db.select().from(organisations).where(eq(organisations.slug, "bramblewake-boatworks")))[0]!;
const day = (offsetDays: number) => new Date(Date.now() + offsetDays * DAY).toISOString().slice(0, 10);

/** The quoted demo request, acceptable again, its quote carrying tax at 8.25 % (the seed's rate card has none). */
async function taxedQuote() {
  const [r] = await db.select().from(requests).where(eq(requests.projectName, "Deck hatch plug"));
  const [q] = await db.select().from(quotes).where(eq(quotes.requestId, r!.id));
  await db.delete(issuedDocuments).where(eq(issuedDocuments.requestId, r!.id));
  const [o] = await db.select().from(orders).where(eq(orders.requestId, r!.id));
  if (o) await db.delete(payments).where(eq(payments.orderId, o.id));
  await db.delete(orders).where(eq(orders.requestId, r!.id));
  await db.delete(documents).where(eq(documents.requestId, r!.id));
  await db.delete(stageEvents).where(eq(stageEvents.requestId, r!.id));
  await db.update(requests).set({ stage: "quoted" }).where(eq(requests.id, r!.id));
  const pre = q!.subtotalCents + q!.marginCents;
  const taxCents = Math.round((pre * TAX_BP) / 10_000);
  await db.update(quotes).set({ status: "issued", acceptedAt: null, acceptedById: null, validUntil: new Date(Date.now() + 20 * DAY), taxBp: TAX_BP, taxCents, totalCents: pre + taxCents, depositCents: 0 }).where(eq(quotes.id, q!.id));
  return { r: r!, q: { ...q!, taxBp: TAX_BP, taxCents, totalCents: pre + taxCents } };
}

async function pdfUpload(userId: string, name = "certificate.pdf") {
  const [u] = await db.insert(uploads).values({ fileKey: `k-${name}-${Math.random()}`, fileName: name, sizeBytes: 4096, url: "http://x/f/c", contentType: name.endsWith(".pdf") ? "application/pdf" : "image/png", userId, purpose: "attachment" }).returning();
  return u!.id;
}

describe("a tax-exemption certificate", () => {
  let certId: string;

  it("is sent by the firm's lead only; an expired one or someone else's file is refused and nothing is stored", async () => {
    const { submitTaxExemption } = await import("../../app/(portal)/portal/(member)/firm/tax-actions");
    const eng = await as("engineer@caldrith.example");
    expect(await submitTaxExemption({ certificateNumber: "RX-100", issuedBy: "US-ME revenue", expiresOn: day(200), uploadId: await pdfUpload(eng) })).toMatchObject({ ok: false, code: "forbidden" });
    const buyer = await as("buyer@bramblewake.example");
    const expired = await submitTaxExemption({ certificateNumber: "RX-100", issuedBy: "US-ME revenue", expiresOn: day(-1), uploadId: await pdfUpload(buyer) });
    expect(expired).toMatchObject({ ok: false, code: "invalid_input", message: "This certificate has already expired; send a current one.", fieldErrors: { expiresOn: ["The expiry date has passed."] } });
    expect(await submitTaxExemption({ certificateNumber: "RX-100", issuedBy: "US-ME revenue", expiresOn: day(200), uploadId: await pdfUpload(eng) })).toMatchObject({ ok: false, code: "invalid_input", fieldErrors: { uploadId: ["Upload the PDF again."] } });
    expect(await submitTaxExemption({ certificateNumber: "RX-100", issuedBy: "US-ME revenue", expiresOn: day(200), uploadId: await pdfUpload(buyer, "cert.png") })).toMatchObject({ ok: false, message: "The certificate must be a PDF." });
    expect(await submitTaxExemption({ certificateNumber: "", issuedBy: "x", expiresOn: "soon", uploadId: "u" })).toMatchObject({ ok: false, code: "invalid_input" });
    expect(await db.select().from(taxExemptions).where(eq(taxExemptions.orgId, (await bw()).id))).toHaveLength(0);
    const ok = await submitTaxExemption({ certificateNumber: "RX-100", issuedBy: "US-ME revenue", expiresOn: day(200), uploadId: await pdfUpload(buyer) });
    expect(ok.ok, ok.ok ? "" : ok.message).toBe(true);
    if (ok.ok) certId = ok.data.id;
    expect((await db.select().from(taxExemptions).where(eq(taxExemptions.id, certId)))[0]).toMatchObject({ status: "pending", certificateNumber: "RX-100" });
  });

  it("pending, it frees nothing: the order carries the quote's tax", async () => {
    const { r, q } = await taxedQuote();
    await as("buyer@bramblewake.example");
    const { acceptQuote } = await import("../../app/(portal)/portal/(member)/requests/[id]/actions");
    const res = await acceptQuote({ quoteId: q.id, poNumber: "BW-TX-0", acceptTerms: true });
    expect(res.ok, res.ok ? "" : res.message).toBe(true);
    const [order] = await db.select().from(orders).where(eq(orders.requestId, r.id));
    expect(order!.taxExemption).toBeNull();
    expect(order!.totalCents).toBe(q.totalCents);
  });

  it("is reviewed by accounts: a rejection needs a note, a decision is made once", async () => {
    const { reviewTaxExemption } = await import("../../app/admin/accounts/terms/actions");
    await as("sales@ostrevane.example");
    expect(await reviewTaxExemption({ id: certId, decision: "approved" })).toMatchObject({ ok: false, code: "forbidden" });
    await as("accounts@ostrevane.example");
    expect(await reviewTaxExemption({ id: certId, decision: "rejected" })).toMatchObject({ ok: false, code: "invalid_input" });
    expect(await reviewTaxExemption({ id: certId, decision: "approved" })).toMatchObject({ ok: true });
    expect(await reviewTaxExemption({ id: certId, decision: "rejected", note: "changed my mind" })).toMatchObject({ ok: false, code: "conflict:reviewed" });
    expect((await db.select().from(taxExemptions).where(eq(taxExemptions.id, certId)))[0]).toMatchObject({ status: "approved" });
  });

  it("approved and unexpired: the order and its invoice carry no tax and say why", async () => {
    const { r, q } = await taxedQuote();
    await as("buyer@bramblewake.example");
    const { acceptQuote } = await import("../../app/(portal)/portal/(member)/requests/[id]/actions");
    const res = await acceptQuote({ quoteId: q.id, poNumber: "BW-TX-1", acceptTerms: true });
    expect(res.ok, res.ok ? "" : res.message).toBe(true);
    const [order] = await db.select().from(orders).where(eq(orders.requestId, r.id));
    expect(order).toMatchObject({ taxBp: 0, taxCents: 0, taxExemption: { certificateNumber: "RX-100", issuedBy: "US-ME revenue" } });
    expect(order!.totalCents).toBe(q.totalCents - q.taxCents);
    const { issueDocumentInTx } = await import("../../lib/documents/issue");
    await db.transaction((tx) => issueDocumentInTx(tx, { kind: "invoice", sourceId: order!.id }));
    const [inv] = await db.select().from(issuedDocuments).where(and(eq(issuedDocuments.sourceId, order!.id), eq(issuedDocuments.kind, "invoice")));
    const data = inv!.data as { totals: { taxCents: number }; taxNote: string };
    expect(data.totals.taxCents).toBe(0);
    expect(data.taxNote).toMatch(/^No tax charged: the buyer holds tax-exemption certificate RX-100 \(issued by US-ME revenue, valid until /);
  });

  it("expired: the firm's page says so, accounts can not approve an expired one, and orders carry tax again", async () => {
    await db.update(taxExemptions).set({ expiresOn: new Date(Date.now() - DAY) }).where(eq(taxExemptions.id, certId));
    const { getValidExemption } = await import("../../db/queries/tax-exemptions");
    expect(await getValidExemption(db, (await bw()).id, new Date())).toBeNull();
    const { r, q } = await taxedQuote();
    await as("buyer@bramblewake.example");
    const { acceptQuote } = await import("../../app/(portal)/portal/(member)/requests/[id]/actions");
    expect((await acceptQuote({ quoteId: q.id, poNumber: "BW-TX-2", acceptTerms: true })).ok).toBe(true);
    const [order] = await db.select().from(orders).where(eq(orders.requestId, r.id));
    expect(order!.taxExemption).toBeNull();
    expect(order!.totalCents).toBe(q.totalCents);
    // A pending certificate that expired while waiting can only be rejected.
    const buyer = await as("buyer@bramblewake.example");
    const [late] = await db.insert(taxExemptions).values({ orgId: (await bw()).id, certificateNumber: "RX-099", issuedBy: "US-ME revenue", expiresOn: new Date(Date.now() - DAY), status: "pending", uploadedById: buyer }).returning();
    await as("accounts@ostrevane.example");
    const { reviewTaxExemption } = await import("../../app/admin/accounts/terms/actions");
    expect(await reviewTaxExemption({ id: late!.id, decision: "approved" })).toMatchObject({ ok: false, code: "conflict:expired" });
    expect((await db.select().from(taxExemptions).where(eq(taxExemptions.id, late!.id)))[0]!.status).toBe("pending");
  });
});
