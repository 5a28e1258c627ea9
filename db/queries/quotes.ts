import "server-only";
import { and, asc, desc, eq, inArray, ne, or, sql } from "drizzle-orm";
import { containsText } from "./search";
import type { Db } from "../client";
import { organisations, orders, quoteLines, quotes, requests, users, type QuoteStatus } from "../schema";
import type { Tx } from "./audit";

export async function listQuotesForRequest(db: Db | Tx, requestId: string) {
  return db.select().from(quotes).where(eq(quotes.requestId, requestId)).orderBy(desc(quotes.version));
}

export async function getQuote(db: Db | Tx, quoteId: string) {
  const [q] = await db.select().from(quotes).where(eq(quotes.id, quoteId));
  return q ?? null;
}

export async function listQuoteLines(db: Db | Tx, quoteId: string) {
  return db.select().from(quoteLines).where(eq(quoteLines.quoteId, quoteId)).orderBy(asc(quoteLines.sort));
}

export interface QuoteWrite {
  lines: {
    partId: string | null;
    kind: (typeof quoteLines.$inferInsert)["kind"];
    description: string;
    quantity: number;
    unitCents: number;
    amountCents: number;
    estimatedCents: number | null;
    editReason: string | null;
  }[];
  totals: { subtotalCents: number; marginCents: number; taxCents: number; totalCents: number; depositCents: number };
  marginBp: number;
  taxBp: number;
  depositBp: number;
  validityDays: number;
  terms: string;
  notes: string;
  shipDate: Date | null;
  leadTime: "standard" | "expedite" | "economy";
  rateCardId: string | null;
}

/** Create the next draft version (n+1) with its lines. */
export async function createDraftQuote(tx: Tx, requestId: string, actorId: string, w: QuoteWrite) {
  const [{ next }] = (await tx
    .select({ next: sql<number>`coalesce(max(${quotes.version}), 0) + 1` })
    .from(quotes)
    .where(eq(quotes.requestId, requestId))) as [{ next: number }];
  const [q] = await tx
    .insert(quotes)
    .values({ requestId, version: next, status: "draft", createdById: actorId, ...quoteColumns(w) })
    .returning({ id: quotes.id, version: quotes.version });
  await replaceLines(tx, q!.id, w.lines);
  return q!;
}

export async function updateDraftQuote(tx: Tx, quoteId: string, w: QuoteWrite) {
  await tx.update(quotes).set(quoteColumns(w)).where(and(eq(quotes.id, quoteId), eq(quotes.status, "draft")));
  await replaceLines(tx, quoteId, w.lines);
}

function quoteColumns(w: QuoteWrite) {
  return {
    ...w.totals,
    marginBp: w.marginBp,
    taxBp: w.taxBp,
    depositBp: w.depositBp,
    validityDays: w.validityDays,
    terms: w.terms,
    notes: w.notes,
    shipDate: w.shipDate,
    leadTime: w.leadTime,
    rateCardId: w.rateCardId,
  };
}

async function replaceLines(tx: Tx, quoteId: string, lines: QuoteWrite["lines"]) {
  await tx.delete(quoteLines).where(eq(quoteLines.quoteId, quoteId));
  if (lines.length) await tx.insert(quoteLines).values(lines.map((l, i) => ({ ...l, quoteId, sort: i })));
}

/** Issue a draft; every other draft or issued version of the request becomes superseded. */
/** Issue a draft: other open versions are superseded; `termsVersion` is the terms of sale it is offered on. */
export async function markIssued(tx: Tx, quoteId: string, requestId: string, actorId: string, issuedAt: Date, validUntil: Date, termsVersion: number | null = null) {
  await tx
    .update(quotes)
    .set({ status: "superseded" })
    .where(and(eq(quotes.requestId, requestId), ne(quotes.id, quoteId), inArray(quotes.status, ["draft", "issued"])));
  const done = await tx
    .update(quotes)
    .set({ status: "issued", issuedAt, issuedById: actorId, validUntil, isStale: false, termsVersion })
    .where(and(eq(quotes.id, quoteId), eq(quotes.status, "draft")))
    .returning({ id: quotes.id });
  return done.length === 1;
}

export async function hasOrder(db: Db | Tx, requestId: string) {
  const [o] = await db.select({ id: orders.id }).from(orders).where(eq(orders.requestId, requestId));
  return Boolean(o);
}

export const QUOTE_SORTS = ["issuedAt", "createdAt", "totalCents", "reference", "status"] as const;

/** Quotes for the by-status view, server-side filter, sort and page. */
export async function listQuotes(
  db: Db,
  input: { status?: QuoteStatus; q?: string; sort?: (typeof QUOTE_SORTS)[number]; dir?: "asc" | "desc"; page?: number; pageSize?: number },
) {
  const pageSize = input.pageSize ?? 25;
  const page = Math.max(1, input.page ?? 1);
  const where = and(
    input.status ? eq(quotes.status, input.status) : undefined,
    input.q ? or(containsText(requests.reference, input.q), containsText(requests.projectName, input.q), containsText(organisations.name, input.q)) : undefined,
  );
  const col = { issuedAt: quotes.issuedAt, createdAt: quotes.createdAt, totalCents: quotes.totalCents, reference: requests.reference, status: quotes.status }[input.sort ?? "createdAt"];
  const rows = await db
    .select({
      id: quotes.id,
      requestId: quotes.requestId,
      reference: requests.reference,
      projectName: requests.projectName,
      firmName: organisations.name,
      version: quotes.version,
      status: quotes.status,
      isStale: quotes.isStale,
      totalCents: quotes.totalCents,
      currency: quotes.currency,
      issuedAt: quotes.issuedAt,
      validUntil: quotes.validUntil,
      createdAt: quotes.createdAt,
      issuedBy: users.name,
    })
    .from(quotes)
    .innerJoin(requests, eq(requests.id, quotes.requestId))
    .innerJoin(organisations, eq(organisations.id, requests.orgId))
    .leftJoin(users, eq(users.id, quotes.issuedById))
    .where(where)
    .orderBy(input.dir === "asc" ? asc(col) : desc(col))
    .limit(pageSize)
    .offset((page - 1) * pageSize);
  const [{ total }] = (await db
    .select({ total: sql<number>`count(*)` })
    .from(quotes)
    .innerJoin(requests, eq(requests.id, quotes.requestId))
    .innerJoin(organisations, eq(organisations.id, requests.orgId))
    .where(where)) as [{ total: number }];
  return { rows, total, page, pageSize };
}

/** Plain rows for the win-rate and turnaround figures. */
export async function quoteOutcomeRows(db: Db) {
  const outcomes = await db.select({ requestId: quotes.requestId, status: quotes.status, validUntil: quotes.validUntil }).from(quotes);
  const turnaround = await db
    .select({ submittedAt: requests.submittedAt, firstIssuedAt: sql<number | null>`min(${quotes.issuedAt})` })
    .from(requests)
    .innerJoin(quotes, eq(quotes.requestId, requests.id))
    .groupBy(requests.id);
  return {
    outcomes,
    turnaround: turnaround.map((t) => ({ submittedAt: t.submittedAt, firstIssuedAt: t.firstIssuedAt === null ? null : new Date(Number(t.firstIssuedAt)) })),
  };
}
