import "server-only";
import { and, asc, desc, eq, inArray, ne } from "drizzle-orm";
import type { Db } from "../client";
import { orders, quoteLines, quotes, requests, type NewOrder } from "../schema";
import type { Tx } from "./audit";

/** Quote versions a client may see: issued ones and their later fates, never a sales draft. */
const CLIENT_VISIBLE = ["issued", "accepted", "superseded", "expired", "declined"] as const;

const quoteColumns = {
  id: quotes.id,
  requestId: quotes.requestId,
  version: quotes.version,
  status: quotes.status,
  isStale: quotes.isStale,
  subtotalCents: quotes.subtotalCents,
  marginCents: quotes.marginCents,
  taxBp: quotes.taxBp,
  taxCents: quotes.taxCents,
  totalCents: quotes.totalCents,
  depositBp: quotes.depositBp,
  depositCents: quotes.depositCents,
  currency: quotes.currency,
  terms: quotes.terms,
  termsVersion: quotes.termsVersion,
  notes: quotes.notes,
  shipDate: quotes.shipDate,
  leadTime: quotes.leadTime,
  issuedAt: quotes.issuedAt,
  validUntil: quotes.validUntil,
  acceptedAt: quotes.acceptedAt,
};

/** Every client-visible version of a request's quote with its lines, newest first. */
export async function listClientQuotes(db: Db | Tx, requestId: string) {
  const qs = await db
    .select(quoteColumns)
    .from(quotes)
    .where(and(eq(quotes.requestId, requestId), inArray(quotes.status, [...CLIENT_VISIBLE])))
    .orderBy(desc(quotes.version));
  if (qs.length === 0) return [];
  const lines = await db
    .select({
      id: quoteLines.id,
      quoteId: quoteLines.quoteId,
      partId: quoteLines.partId,
      kind: quoteLines.kind,
      description: quoteLines.description,
      quantity: quoteLines.quantity,
      unitCents: quoteLines.unitCents,
      amountCents: quoteLines.amountCents,
      sort: quoteLines.sort,
    })
    .from(quoteLines)
    .where(inArray(quoteLines.quoteId, qs.map((q) => q.id)))
    .orderBy(asc(quoteLines.sort));
  return qs.map((q) => ({ ...q, lines: lines.filter((l) => l.quoteId === q.id) }));
}
export type ClientQuote = Awaited<ReturnType<typeof listClientQuotes>>[number];

/** One quote with its request's scope fields. */
export async function getQuoteWithRequest(db: Db | Tx, quoteId: string) {
  const [row] = await db
    .select({ quote: quotes, request: requests })
    .from(quotes)
    .innerJoin(requests, eq(requests.id, quotes.requestId))
    .where(eq(quotes.id, quoteId));
  return row ?? null;
}

/** The highest issued version of a request's quote, if any. */
export async function getLatestIssuedVersion(db: Db | Tx, requestId: string) {
  const [row] = await db
    .select({ version: quotes.version })
    .from(quotes)
    .where(and(eq(quotes.requestId, requestId), inArray(quotes.status, ["issued", "accepted", "superseded", "expired"])))
    .orderBy(desc(quotes.version))
    .limit(1);
  return row?.version ?? null;
}

/**
 * Accept an issued quote: the quote row (guarded by its status), other open versions marked
 * superseded, and the order row. The caller checks the policy and moves the stage in the same tx.
 */
export async function acceptQuoteAndCreateOrder(
  tx: Tx,
  input: {
    quoteId: string; requestId: string; orgId: string; acceptedById: string; poNumber: string; termsVersion: number | null; totalCents: number; depositCents: number; balanceCents: number; currency: string; now: Date;
    /** The order's own figures, ship-to and the rest (lib/orders/acceptance.ts). */
    extra?: Partial<Pick<NewOrder, "shipTo" | "billTo" | "lines" | "subtotalCents" | "marginCents" | "taxBp" | "taxCents" | "taxExemption" | "paymentTerms" | "poUploadId">>;
  },
) {
  const updated = await tx
    .update(quotes)
    .set({ status: "accepted", acceptedAt: input.now, acceptedById: input.acceptedById })
    .where(and(eq(quotes.id, input.quoteId), eq(quotes.status, "issued")))
    .returning({ id: quotes.id });
  if (updated.length !== 1) return null;
  await tx
    .update(quotes)
    .set({ status: "superseded" })
    .where(and(eq(quotes.requestId, input.requestId), ne(quotes.id, input.quoteId), eq(quotes.status, "issued")));
  const [order] = await tx
    .insert(orders)
    .values({
      requestId: input.requestId,
      orgId: input.orgId,
      quoteId: input.quoteId,
      poNumber: input.poNumber,
      termsVersion: input.termsVersion,
      totalCents: input.totalCents,
      depositCents: input.depositCents,
      balanceCents: input.balanceCents,
      currency: input.currency,
      ...input.extra,
    })
    .returning({ id: orders.id });
  return order!;
}

/** Mark every open quote of a request stale (a part got a new file revision). */
export async function markQuotesStale(db: Db | Tx, requestId: string) {
  await db
    .update(quotes)
    .set({ isStale: true })
    .where(and(eq(quotes.requestId, requestId), inArray(quotes.status, ["draft", "issued"])));
}
