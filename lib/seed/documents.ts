import { and, eq, inArray, ne } from "drizzle-orm";
import { issueDocumentInTx, type IssueRequest } from "@/lib/documents/issue";
import type { Db } from "@/db/client";
import * as s from "@/db/schema";

/** Terms of sale, version 1 of the demo catalogue (invented wording, common practice in substance). */
export const DEMO_TERMS = {
  title: "Terms of sale",
  body: [
    "1. Offer and acceptance. A quotation is an offer open until its validity date. It is accepted on the client portal with a purchase order number; the order is then made on these terms, which prevail over any terms printed on a purchase order.",
    "2. Price and payment. Prices are in the quotation's currency and exclude duties. A deposit of the share stated on the quotation is due on acceptance; work is scheduled once it is received. The balance is invoiced when the parts ship and is due on receipt of the invoice.",
    "3. Files and fitness for use. Parts are made to the files and options the client supplied. Dimensions follow the quotation's finish allowance and machining; fitness of a tool for its use, including its cure temperature and pressure, rests with the client's own engineering sign-off.",
    "4. Delivery and risk. Ship dates are estimates from the bureau's calendars. Risk passes to the client when the parts leave the bureau; title passes when the order is paid in full.",
    "5. Safety. Large printed tools are heavy and may be hot after printing or machining. The client handles, lifts and uses them under local codes and licensed practice.",
    "6. Changes and cancellation. A change to a part's file makes a new quotation. Work cancelled after the deposit is charged at cost to the date of cancellation; any excess of the deposit is refunded and a credit note issued.",
    "7. Confidentiality. Files and drawings are kept confidential and used only to quote and make the order; requests flagged controlled are opened only by staff cleared for such work.",
  ].join("\n\n"),
};

/**
 * Issue the documents the seeded orders would have received as they moved along: a quote for
 * each issued version, a deposit invoice for each paid deposit, and for shipped orders the
 * balance invoice and the packing list. Issued in date order, so the numbers run with the dates.
 * PDFs are rendered on first download (from the frozen snapshot), which keeps seeding fast.
 */
export async function seedDocuments(db: Db): Promise<number> {
  const todo: (IssueRequest & { at: Date })[] = [];
  for (const q of await db.select({ id: s.quotes.id, issuedAt: s.quotes.issuedAt }).from(s.quotes).where(ne(s.quotes.status, "draft"))) {
    if (q.issuedAt) todo.push({ kind: "quote", sourceId: q.id, at: q.issuedAt, now: q.issuedAt });
  }
  for (const p of await db.select({ id: s.payments.id, paidAt: s.payments.paidAt }).from(s.payments).where(and(eq(s.payments.kind, "deposit"), inArray(s.payments.status, ["paid", "partially_refunded", "refunded"])))) {
    if (p.paidAt) todo.push({ kind: "deposit_invoice", sourceId: p.id, at: p.paidAt, now: p.paidAt });
  }
  const shipped = await db
    .select({ orderId: s.orders.id, at: s.stageEvents.at })
    .from(s.orders)
    .innerJoin(s.stageEvents, and(eq(s.stageEvents.requestId, s.orders.requestId), eq(s.stageEvents.toStage, "shipped")));
  for (const o of shipped) {
    todo.push({ kind: "packing_list", sourceId: o.orderId, at: o.at, now: o.at });
    todo.push({ kind: "invoice", sourceId: o.orderId, at: new Date(o.at.getTime() + 1), now: new Date(o.at.getTime() + 1) });
  }
  for (const r of await db.select({ id: s.refunds.id, at: s.refunds.createdAt }).from(s.refunds).where(eq(s.refunds.status, "succeeded"))) {
    todo.push({ kind: "credit_note", sourceId: r.id, at: r.at, now: r.at });
  }
  todo.sort((a, b) => a.at.getTime() - b.at.getTime());
  for (const t of todo) await db.transaction((tx) => issueDocumentInTx(tx, t));
  return todo.length;
}
