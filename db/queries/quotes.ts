import "server-only";
import { and, asc, desc, eq, inArray, ne, or, sql } from "drizzle-orm";
import { containsText } from "./search";
import type { Db } from "../client";
import { analyses, fileRevisions, messages, organisations, orders, parts, quoteLines, quotes, requests, users, type QuoteStatus } from "../schema";
import type { Tx } from "./audit";

/** Requests waiting for sales: submitted ones, and quoted ones whose quote went stale. */
export async function listInbox(db: Db) {
  const stale = sql<number>`(select count(*) from ${quotes} q where q.request_id = ${requests.id} and q.is_stale = 1 and q.status in ('draft','issued'))`;
  return db
    .select({
      id: requests.id,
      reference: requests.reference,
      projectName: requests.projectName,
      firmName: organisations.name,
      stage: requests.stage,
      neededBy: requests.neededBy,
      submittedAt: requests.submittedAt,
      isControlled: requests.isControlled,
      cureProcess: requests.cureProcess,
      partCount: sql<number>`(select count(*) from ${parts} p where p.request_id = ${requests.id})`,
      staleQuotes: stale,
    })
    .from(requests)
    .innerJoin(organisations, eq(organisations.id, requests.orgId))
    .where(or(eq(requests.stage, "submitted"), and(inArray(requests.stage, ["quoted"]), sql`${stale} > 0`)));
}

/** A request with its parts, each part's current revision and latest analysis, for the sales view. */
export async function getRequestForSales(db: Db | Tx, requestId: string) {
  const [request] = await db
    .select({
      id: requests.id,
      reference: requests.reference,
      projectName: requests.projectName,
      orgId: requests.orgId,
      firmName: organisations.name,
      createdById: requests.createdById,
      stage: requests.stage,
      heldFromStage: requests.heldFromStage,
      neededBy: requests.neededBy,
      submittedAt: requests.submittedAt,
      cureProcess: requests.cureProcess,
      cureTempC: requests.cureTempC,
      partCtePpmPerK: requests.partCtePpmPerK,
      isControlled: requests.isControlled,
      leadTime: requests.leadTime,
      notes: requests.notes,
    })
    .from(requests)
    .innerJoin(organisations, eq(organisations.id, requests.orgId))
    .where(eq(requests.id, requestId));
  if (!request) return null;
  const partRows = await db
    .select({
      id: parts.id,
      name: parts.name,
      materialKey: parts.materialKey,
      allowanceMm: parts.allowanceMm,
      quantity: parts.quantity,
      units: parts.units,
      revisionId: fileRevisions.id,
      revision: fileRevisions.revision,
      fileName: fileRevisions.fileName,
      revisionCreatedAt: fileRevisions.createdAt,
    })
    .from(parts)
    .leftJoin(fileRevisions, eq(fileRevisions.id, parts.currentRevisionId))
    .where(eq(parts.requestId, requestId))
    .orderBy(asc(parts.sort), asc(parts.createdAt));
  const revisionIds = partRows.map((p) => p.revisionId).filter((x): x is string => Boolean(x));
  const analysisRows = revisionIds.length
    ? await db
        .select({ id: analyses.id, revisionId: analyses.revisionId, status: analyses.status, result: analyses.result, errorMessage: analyses.errorMessage, createdAt: analyses.createdAt })
        .from(analyses)
        .where(inArray(analyses.revisionId, revisionIds))
        .orderBy(desc(analyses.createdAt))
    : [];
  const latest = new Map<string, (typeof analysisRows)[number]>();
  for (const a of analysisRows) if (!latest.has(a.revisionId)) latest.set(a.revisionId, a);
  return {
    request,
    parts: partRows.map((p) => ({ ...p, analysis: p.revisionId ? (latest.get(p.revisionId) ?? null) : null })),
  };
}
export type SalesRequest = NonNullable<Awaited<ReturnType<typeof getRequestForSales>>>;

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

export async function listMessages(db: Db | Tx, requestId: string) {
  return db
    .select({ id: messages.id, body: messages.body, isFromStaff: messages.isFromStaff, createdAt: messages.createdAt, authorName: users.name, authorEmail: users.email })
    .from(messages)
    .innerJoin(users, eq(users.id, messages.authorId))
    .where(eq(messages.requestId, requestId))
    .orderBy(asc(messages.createdAt));
}

export async function createStaffMessage(tx: Tx, input: { requestId: string; orgId: string; authorId: string; body: string }) {
  const [m] = await tx.insert(messages).values({ ...input, isFromStaff: true }).returning({ id: messages.id });
  return m!;
}
