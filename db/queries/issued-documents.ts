import { and, asc, desc, eq, isNull, sql } from "drizzle-orm";
import type { Db } from "../client";
import { documentSeries, issuedDocuments, organisations, quoteLines, quotes, requests, termsOfSale, type IssuedDocumentKind } from "../schema";
import { formatDocumentNumber, SERIES_BY_KIND, seriesYear } from "../document-number";
import type { Tx } from "./audit";

/**
 * Take the next number of a series for a year. The single UPSERT … RETURNING is the transaction's
 * first write, so it takes SQLite's write lock at once: two issuers queue (busy timeout) instead
 * of both reading the same last number. Call it inside the transaction that inserts the document,
 * so a rolled-back document gives its number back.
 */
export async function allocateNumber(tx: Tx, series: string, year: number): Promise<number> {
  const [row] = await tx
    .insert(documentSeries)
    .values({ series, year, lastNumber: 1 })
    .onConflictDoUpdate({ target: [documentSeries.series, documentSeries.year], set: { lastNumber: sql`${documentSeries.lastNumber} + 1` } })
    .returning({ lastNumber: documentSeries.lastNumber });
  return row!.lastNumber;
}

export interface IssueInput {
  kind: IssuedDocumentKind;
  sourceId: string;
  requestId: string;
  orgId: string;
  data: Record<string, unknown>;
  issuedAt: Date;
  issuedById?: string | null;
}

/**
 * Insert a document with the next number of its series, at most once per (kind, source): a
 * second call for the same quote, payment, refund or order returns the first document and
 * takes no number. Pass `tx` to issue inside the caller's transaction.
 */
export async function insertIssuedDocument(tx: Tx, input: IssueInput): Promise<{ id: string; number: string; isNew: boolean }> {
  const [existing] = await tx
    .select({ id: issuedDocuments.id, number: issuedDocuments.number })
    .from(issuedDocuments)
    .where(and(eq(issuedDocuments.kind, input.kind), eq(issuedDocuments.sourceId, input.sourceId)));
  if (existing) return { ...existing, isNew: false };
  const series = SERIES_BY_KIND[input.kind];
  const year = seriesYear(input.issuedAt);
  const seq = await allocateNumber(tx, series, year);
  const number = formatDocumentNumber(series, year, seq);
  const [row] = await tx
    .insert(issuedDocuments)
    .values({ ...input, data: { ...input.data, number }, series, year, seq, number, issuedById: input.issuedById ?? null })
    .returning({ id: issuedDocuments.id });
  return { id: row!.id, number, isNew: true };
}

/** Store the rendered PDF once; a document that already has its bytes keeps them. */
export async function storeDocumentPdf(db: Db | Tx, id: string, pdf: Buffer, sha256: string): Promise<boolean> {
  const r = await db
    .update(issuedDocuments)
    .set({ pdf, pdfSha256: sha256 })
    .where(and(eq(issuedDocuments.id, id), isNull(issuedDocuments.pdf)))
    .returning({ id: issuedDocuments.id });
  return r.length === 1;
}

/** A request's issued documents, oldest first (the columns a list needs, no bytes). */
export async function listIssuedDocuments(db: Db | Tx, requestId: string) {
  return db
    .select({ id: issuedDocuments.id, kind: issuedDocuments.kind, number: issuedDocuments.number, sourceId: issuedDocuments.sourceId, issuedAt: issuedDocuments.issuedAt })
    .from(issuedDocuments)
    .where(eq(issuedDocuments.requestId, requestId))
    .orderBy(asc(issuedDocuments.issuedAt), asc(issuedDocuments.series), asc(issuedDocuments.seq));
}

/** One document with the scope fields of its request, or null. */
export async function getIssuedDocument(db: Db | Tx, id: string) {
  const [row] = await db
    .select({ doc: issuedDocuments, request: { id: requests.id, orgId: requests.orgId, createdById: requests.createdById, reference: requests.reference } })
    .from(issuedDocuments)
    .innerJoin(requests, eq(requests.id, issuedDocuments.requestId))
    .where(eq(issuedDocuments.id, id));
  return row ?? null;
}

export async function getIssuedDocumentBySource(db: Db | Tx, kind: IssuedDocumentKind, sourceId: string) {
  const [row] = await db.select().from(issuedDocuments).where(and(eq(issuedDocuments.kind, kind), eq(issuedDocuments.sourceId, sourceId)));
  return row ?? null;
}

/** Documents whose PDF was never stored (a crash between issue and render), oldest first. */
export async function listDocumentsWithoutPdf(db: Db | Tx, limit = 50) {
  return db.select({ id: issuedDocuments.id }).from(issuedDocuments).where(isNull(issuedDocuments.pdf)).orderBy(asc(issuedDocuments.createdAt)).limit(limit);
}

/** The current terms of sale, or null when none were ever written. */
export async function getCurrentTerms(db: Db | Tx) {
  const [row] = await db.select().from(termsOfSale).where(eq(termsOfSale.isCurrent, true)).orderBy(desc(termsOfSale.version)).limit(1);
  return row ?? null;
}

export async function getTermsVersion(db: Db | Tx, version: number) {
  const [row] = await db.select().from(termsOfSale).where(eq(termsOfSale.version, version));
  return row ?? null;
}

/** Publish new terms of sale as version n+1; older versions stay for the quotes that cite them. */
export async function publishTerms(tx: Tx, input: { title: string; body: string; createdById: string | null }) {
  const [last] = await tx.select({ version: termsOfSale.version }).from(termsOfSale).orderBy(desc(termsOfSale.version)).limit(1);
  const version = (last?.version ?? 0) + 1;
  await tx.update(termsOfSale).set({ isCurrent: false }).where(eq(termsOfSale.isCurrent, true));
  await tx.insert(termsOfSale).values({ version, title: input.title, body: input.body, createdById: input.createdById, isCurrent: true });
  return version;
}

/** A request with its firm's name and billing contact (for the documents printed for it). */
export async function getRequestWithFirm(db: Db | Tx, requestId: string) {
  const [row] = await db
    .select({ request: requests, firm: { name: organisations.name, billingContact: organisations.billingContact, billingEmail: organisations.billingEmail } })
    .from(requests)
    .innerJoin(organisations, eq(organisations.id, requests.orgId))
    .where(eq(requests.id, requestId));
  return row ?? null;
}

/** A quote with its lines in order (for the documents printed from it). */
export async function getQuoteWithLines(db: Db | Tx, quoteId: string) {
  const [quote] = await db.select().from(quotes).where(eq(quotes.id, quoteId));
  if (!quote) return null;
  const lines = await db.select().from(quoteLines).where(eq(quoteLines.quoteId, quoteId)).orderBy(asc(quoteLines.sort));
  return { quote, lines };
}

