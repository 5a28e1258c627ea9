import { createHash, randomUUID } from "node:crypto";
import { and, eq, inArray } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { execFile } from "node:child_process";
import path from "node:path";
import type { Db } from "../../db/client";
import { allocateNumber } from "../../db/queries/issued-documents";
import { emailOutbox, issuedDocuments, orders, organisations, payments, quotes, refunds, requests, users } from "../../db/schema";
import { startResendFake, type FakeEmail, type ResendFake } from "../../mocks/resend/server";
import { resetEnvCache } from "../../lib/env";
import { resetResendClient } from "../../lib/email/send";
import { formatCents } from "../../lib/money";
import { parseDocumentNumber } from "../../lib/documents/numbering";
import { pdfText } from "../helpers/pdf-text";
import { createTestDb, type TestDb } from "../helpers/test-db";
import { dbRef, session } from "../support/integration";

vi.mock("@/lib/auth/config", async () => (await import("../support/integration")).authConfigMock);
vi.mock("@/lib/auth/session", async () => (await import("../support/integration")).sessionMock);
vi.mock("@/db/client", async (importOriginal) => (await import("../support/integration")).dbClientMock(importOriginal));

let t: TestDb;
let db: Db;
let resend: ResendFake;
/** What the e-mail API fake received over the wire (the app writes its own outbox besides). */
const received: FakeEmail[] = [];

beforeAll(async () => {
  t = await createTestDb({ seeded: true });
  db = t.db;
  dbRef.db = db;
  resend = await startResendFake({
    port: 0,
    store: (m) => {
      received.push(m);
    },
    log: () => {},
  });
  process.env.RESEND_BASE_URL = resend.url;
  resetEnvCache();
  resetResendClient();
}, 180_000);
afterAll(async () => {
  await resend?.close();
  t?.close();
});

const as = async (email: string) => {
  const [u] = await db.select({ id: users.id }).from(users).where(eq(users.email, email));
  session.current = { user: { id: u!.id } };
};
const byProject = async (name: string) => (await db.select().from(requests).where(eq(requests.projectName, name)))[0]!;
const docsOf = async (requestId: string) => db.select().from(issuedDocuments).where(eq(issuedDocuments.requestId, requestId));
/** Amounts as printed, whitespace removed (pdf.js may split a figure into runs). */
const compact = (s: string) => s.replace(/\s+/g, "");

describe("numbering", () => {
  it("has no gaps and no repeats when four processes issue at once, with some rolled back", async () => {
    // A draft no other test reads: the race leaves its 128 packing lists there.
    const [r] = await db.select({ id: requests.id, orgId: requests.orgId }).from(requests).where(eq(requests.projectName, "Nacelle inner skin tool (trial)"));
    // Four processes on one file, as the app runs (one per core): each issues 40 documents and
    // rolls every fifth back after its number was taken; the number must come back.
    const startAt = String(Date.now() + 12_000);
    const runs = await Promise.all(
      ["a", "b", "c", "d"].map(
        (tag) =>
          new Promise<{ committed: string[]; rolledBack: number }>((resolve, reject) => {
            execFile(path.resolve("node_modules/.bin/tsx"), ["tests/helpers/issue-race.ts", t.url, r!.id, r!.orgId, "40", tag, startAt], { cwd: process.cwd(), timeout: 150_000 }, (err, stdout, stderr) =>
              err ? reject(new Error(`${err.message}\n${stderr}`)) : resolve(JSON.parse(stdout)),
            );
          }),
      ),
    );
    const committed = runs.flatMap((x) => x.committed);
    expect(runs.map((x) => x.rolledBack)).toEqual([8, 8, 8, 8]);
    expect(committed).toHaveLength(128);
    // They did race: no process got one unbroken block of numbers.
    const blocks = runs.map((x) => x.committed.map((n) => parseDocumentNumber(n)!.seq)).filter((seqs) => seqs.every((v, i) => i === 0 || v === seqs[i - 1]! + 1));
    expect(blocks.length).toBeLessThan(4);
    const rows = await db.select({ seq: issuedDocuments.seq, number: issuedDocuments.number }).from(issuedDocuments).where(and(eq(issuedDocuments.series, "PL"), eq(issuedDocuments.year, 2031)));
    const seqs = rows.map((x) => x.seq).sort((a, b) => a - b);
    expect(seqs).toEqual(Array.from({ length: 128 }, (_, i) => i + 1));
    expect(new Set(rows.map((x) => x.number))).toEqual(new Set(committed));
    expect(rows.every((x) => parseDocumentNumber(x.number)?.year === 2031)).toBe(true);
  }, 180_000);

  it("starts each series afresh every year, and the invoice kinds share one series", async () => {
    const tx = db;
    const a = await tx.transaction((x) => allocateNumber(x, "CN", 2040));
    const b = await tx.transaction((x) => allocateNumber(x, "CN", 2041));
    expect([a, b]).toEqual([1, 1]);
    const inv = await db.select({ kind: issuedDocuments.kind, series: issuedDocuments.series }).from(issuedDocuments).where(inArray(issuedDocuments.kind, ["deposit_invoice", "invoice"]));
    expect(new Set(inv.map((x) => x.series))).toEqual(new Set(["INV"]));
  });
});

describe("the seeded orders' documents, read back with a PDF text extractor", () => {
  it("a shipped order: quote, deposit invoice, balance invoice and packing list carry their numbers and the database's figures", async () => {
    const { ensureDocumentPdf } = await import("../../lib/documents/issue");
    const r = await byProject("Cockpit liner plug");
    const [order] = await db.select().from(orders).where(eq(orders.requestId, r.id));
    const [quote] = await db.select().from(quotes).where(eq(quotes.id, order!.quoteId));
    const [deposit] = await db.select().from(payments).where(and(eq(payments.orderId, order!.id), eq(payments.kind, "deposit")));
    const [firm] = await db.select().from(organisations).where(eq(organisations.id, r.orgId));
    const docs = await docsOf(r.id);
    expect(docs.map((d) => d.kind).sort()).toEqual(["deposit_invoice", "invoice", "packing_list", "quote"]);
    const text = async (kind: string) => {
      const d = docs.find((x) => x.kind === kind)!;
      const pdf = await ensureDocumentPdf(db, d.id);
      expect(pdf.subarray(0, 5).toString()).toBe("%PDF-");
      const { text } = await pdfText(pdf);
      expect(text).toContain(d.number);
      expect(text).toContain(firm!.name);
      expect(text).toContain(r.reference);
      return { d, text, flat: compact(text) };
    };
    const q = await text("quote");
    expect(q.flat).toContain(compact(`Total ${formatCents(quote!.totalCents)}`));
    expect(q.flat).toContain(compact(formatCents(quote!.depositCents)));
    expect(q.text).toContain("Terms of sale, version 1");
    expect(q.text).toMatch(/Valid until/i);
    expect(q.text).toContain("Safety");

    const di = await text("deposit_invoice");
    expect(di.flat).toContain(compact(`Deposit ${formatCents(deposit!.amountCents)}`));
    expect(di.text).toContain(q.d.number);

    const inv = await text("invoice");
    expect(inv.flat).toContain(compact(`Order total ${formatCents(order!.totalCents)}`));
    expect(inv.flat).toContain(compact(`Balance due ${formatCents(order!.balanceCents)}`));
    expect(inv.text).toContain(di.d.number);
    expect(inv.text).toContain(order!.poNumber);

    const pl = await text("packing_list");
    expect(pl.text).toContain(order!.trackingNumber!);
    expect(pl.text).toMatch(/lifting equipment rated for the load/);
  }, 120_000);

  it("the closed order with a refund after delivery lists its credit note, against the balance invoice, for the refunded amount", async () => {
    const { ensureDocumentPdf } = await import("../../lib/documents/issue");
    const r = await byProject("Flap track fairing tool");
    const [order] = await db.select().from(orders).where(eq(orders.requestId, r.id));
    const [balance] = await db.select().from(payments).where(and(eq(payments.orderId, order!.id), eq(payments.kind, "balance")));
    const [refund] = await db.select().from(refunds).where(eq(refunds.paymentId, balance!.id));
    expect(balance).toMatchObject({ status: "partially_refunded", refundedCents: refund!.amountCents });
    const docs = await docsOf(r.id);
    expect(docs.map((d) => d.kind).sort()).toEqual(["credit_note", "deposit_invoice", "invoice", "packing_list", "quote"]);
    const cn = docs.find((d) => d.kind === "credit_note")!;
    expect(cn.number).toMatch(/^CN-\d{4}-\d{5}$/);
    const { text } = await pdfText(await ensureDocumentPdf(db, cn.id));
    expect(text).toContain(cn.number);
    expect(compact(text)).toContain(compact(formatCents(refund!.amountCents)));
    expect(text).toContain(docs.find((d) => d.kind === "invoice")!.number);
  }, 120_000);

  it("a document never changes: the same bytes on every download, and issuing again issues nothing", async () => {
    const { ensureDocumentPdf, issueDocument } = await import("../../lib/documents/issue");
    const r = await byProject("Cockpit liner plug");
    const [d] = (await docsOf(r.id)).filter((x) => x.kind === "quote");
    const first = await ensureDocumentPdf(db, d!.id);
    const again = await ensureDocumentPdf(db, d!.id);
    expect(Buffer.compare(first, again)).toBe(0);
    const [row] = await db.select().from(issuedDocuments).where(eq(issuedDocuments.id, d!.id));
    expect(row!.pdfSha256).toBe(createHash("sha256").update(first).digest("hex"));
    const before = (await db.select().from(issuedDocuments)).length;
    const re = await issueDocument(db, { kind: "quote", sourceId: d!.sourceId });
    expect(re).toMatchObject({ id: d!.id, number: d!.number, isNew: false });
    expect((await db.select().from(issuedDocuments)).length).toBe(before);
  }, 60_000);
});

describe("notices carry their document", () => {
  it("a refund issues a credit note against the deposit invoice and e-mails it attached", async () => {
    const { issueDocument } = await import("../../lib/documents/issue");
    const { notifyRefund } = await import("../../lib/email/notify");
    const r = await byProject("Cockpit liner plug");
    const [order] = await db.select().from(orders).where(eq(orders.requestId, r.id));
    const [deposit] = await db.select().from(payments).where(and(eq(payments.orderId, order!.id), eq(payments.kind, "deposit")));
    const [refund] = await db.insert(refunds).values({ paymentId: deposit!.id, amountCents: 12_345, reason: "Crate reused from an earlier order", status: "succeeded", stripeRefundId: "re_doc_test", idempotencyKey: "doc-test-1" }).returning();
    const cn = await issueDocument(db, { kind: "credit_note", sourceId: refund!.id });
    expect(cn.number).toMatch(/^CN-\d{4}-\d{5}$/);
    const { text } = await pdfText(cn.pdf);
    const depositInvoice = (await docsOf(r.id)).find((d) => d.kind === "deposit_invoice")!;
    expect(text).toContain(cn.number);
    expect(text).toContain(depositInvoice.number);
    expect(compact(text)).toContain(compact(`Credited ${formatCents(12_345)}`));

    await notifyRefund(refund!.id);
    const [mail] = (await db.select().from(emailOutbox).where(eq(emailOutbox.subject, `Refund on ${r.reference}`))).slice(-1);
    const attached = [{ filename: `${cn.number}.pdf`, contentType: "application/pdf", sizeBytes: cn.pdf.length, sha256: createHash("sha256").update(cn.pdf).digest("hex") }];
    expect(mail!.attachments).toEqual(attached);
    expect(received.find((m) => m.subject === `Refund on ${r.reference}`)?.attachments).toEqual(attached);
    expect((mail!.text ?? "").replace(/\s+/g, " ")).toContain(`Credit note ${cn.number} (PDF)`);
  }, 60_000);

  it("shipped and balance-due notices attach the packing list and the invoice", async () => {
    const { notifyBalanceDue, notifyShipped } = await import("../../lib/email/notify");
    const r = await byProject("Cockpit liner plug");
    const [order] = await db.select().from(orders).where(eq(orders.requestId, r.id));
    const docs = await docsOf(r.id);
    await notifyShipped(order!.id);
    await notifyBalanceDue(order!.id);
    const mails = await db.select().from(emailOutbox);
    const shipped = mails.filter((m) => m.subject === `${r.reference} has shipped`).at(-1)!;
    const due = mails.filter((m) => m.subject === `Balance due for ${r.reference}`).at(-1)!;
    expect(shipped.attachments?.map((a) => a.filename)).toEqual([`${docs.find((d) => d.kind === "packing_list")!.number}.pdf`]);
    expect(due.attachments?.map((a) => a.filename)).toEqual([`${docs.find((d) => d.kind === "invoice")!.number}.pdf`]);
  }, 60_000);
});

describe("the documents API and the download route", () => {
  it("lists a request's documents for its firm, 404 for another firm, and serves PDFs only to whom the roles allow", async () => {
    const list = (await import("../../app/api/portal/requests/[id]/documents/route")).GET;
    const pdf = (await import("../../app/api/documents/[id]/route")).GET;
    const r = await byProject("Cockpit liner plug"); // a Bramblewake order
    const call = (id: string) => list(new Request(`http://t/api/portal/requests/${id}/documents`), { params: Promise.resolve({ id }) });
    const open = (id: string) => pdf(new Request(`http://t/api/documents/${id}`), { params: Promise.resolve({ id }) });

    session.current = null;
    expect((await call(r.id)).status).toBe(401);

    await as("buyer@bramblewake.example");
    const res = await call(r.id);
    expect(res.status).toBe(200);
    const body = (await res.json()) as { kind: string; number: string; issuedAt: string; url: string }[];
    const stored = await docsOf(r.id);
    expect(body.map((d) => d.number).sort()).toEqual(stored.map((d) => d.number).sort());
    expect(Object.keys(body[0]!).sort()).toEqual(["issuedAt", "kind", "number", "url"]);
    const first = body[0]!;
    const got = await open(first.url.split("/").at(-1)!);
    expect(got.status).toBe(200);
    expect(got.headers.get("content-type")).toBe("application/pdf");
    expect((await pdfText(new Uint8Array(await got.arrayBuffer()))).text).toContain(first.number);

    await as("lead@caldrith.example");
    expect((await call(r.id)).status).toBe(404);
    expect((await open(first.url.split("/").at(-1)!)).status).toBe(404);
    expect((await open("not-a-document")).status).toBe(404);
    expect((await open(randomUUID())).status).toBe(404);

    // Staff see the kinds their work needs: production the packing list, not the invoices.
    await as("production@ostrevane.example");
    const prod = (await (await call(r.id)).json()) as { kind: string; url: string }[];
    expect(prod.map((d) => d.kind)).toEqual(["packing_list"]);
    const invoice = stored.find((d) => d.kind === "invoice")!;
    expect((await open(invoice.id)).status).toBe(404);
    await as("accounts@ostrevane.example");
    expect((await open(invoice.id)).status).toBe(200);

    // A request with no documents lists none.
    const fresh = await byProject("Inlet duct layup tool");
    await as("engineer@caldrith.example");
    const none = await call(fresh.id);
    expect(none.status).toBe(200);
    expect(await none.json()).toEqual([]);
  }, 60_000);
});
