import "server-only";
import { and, asc, count, desc, eq, gt, inArray, lt, sql } from "drizzle-orm";
import { readRows, type Db } from "../client";
import type { Stage } from "../schema/common";
import { analyses, documents, fileRevisions, uploads, orders, organisations, parts, payments, requests, scheduleBlocks, stageEvents, users } from "../schema";
import type { Tx } from "./audit";
import type { EstimateResult } from "../../lib/estimating/types";

/** One board card: what the card shows, nothing more. */
const boardCard = {
  orderId: orders.id,
  reference: requests.reference,
  projectName: requests.projectName,
  firmName: organisations.name,
  stage: requests.stage,
  heldFromStage: requests.heldFromStage,
  isControlled: requests.isControlled,
  plannedShip: orders.plannedShip,
};

/** Cards of one board column (its stages), nearest planned start first, a page at a time. */
export async function listBoardColumn(db: Db, stages: readonly Stage[], page: { limit: number; offset: number }) {
  return db
    .select(boardCard)
    .from(requests)
    .innerJoin(orders, eq(orders.requestId, requests.id))
    .innerJoin(organisations, eq(organisations.id, orders.orgId))
    .where(inArray(requests.stage, [...stages]))
    .orderBy(asc(orders.plannedStart), asc(requests.updatedAt), asc(requests.id))
    .limit(page.limit)
    .offset(page.offset);
}

/** The database's count of changes to what the board shows (raised by triggers; see the schema). */
export async function boardVersion(db: Db): Promise<number> {
  const [row] = await readRows<{ n: number }>(db, "select n from change_counters where name = 'board'");
  return Number(row?.n ?? 0);
}

/** How many orders with an order record sit in each of these stages. */
export async function countOrdersByStage(db: Db, stages: readonly Stage[]): Promise<Partial<Record<Stage, number>>> {
  const rows = await db
    .select({ stage: requests.stage, n: count() })
    .from(requests)
    .innerJoin(orders, eq(orders.requestId, requests.id))
    .where(inArray(requests.stage, [...stages]))
    .groupBy(requests.stage);
  return Object.fromEntries(rows.map((r) => [r.stage, r.n]));
}

/** One order with what production needs: parts and their estimates, blocks, stage history, payments. */
export async function getOrderForProduction(db: Db | Tx, orderId: string) {
  const [row] = await db
    .select({ order: orders, request: requests, firmName: organisations.name })
    .from(orders)
    .innerJoin(requests, eq(requests.id, orders.requestId))
    .innerJoin(organisations, eq(organisations.id, orders.orgId))
    .where(eq(orders.id, orderId));
  if (!row) return null;
  const [partRows, blocks, events, pays] = await Promise.all([
    partsWithEstimates(db, row.request.id),
    db.select().from(scheduleBlocks).where(eq(scheduleBlocks.orderId, orderId)).orderBy(asc(scheduleBlocks.startsAt)),
    db
      .select({ id: stageEvents.id, fromStage: stageEvents.fromStage, toStage: stageEvents.toStage, note: stageEvents.note, at: stageEvents.at, actor: users.name })
      .from(stageEvents)
      .leftJoin(users, eq(users.id, stageEvents.actorId))
      .where(eq(stageEvents.requestId, row.request.id))
      .orderBy(desc(stageEvents.at)),
    db.select({ id: payments.id, kind: payments.kind, status: payments.status, amountCents: payments.amountCents }).from(payments).where(eq(payments.orderId, orderId)),
  ]);
  return { ...row, parts: partRows, blocks, events, payments: pays };
}
export type ProductionOrder = NonNullable<Awaited<ReturnType<typeof getOrderForProduction>>>;

/** Parts of a request with the latest finished analysis of their current revision. */
export async function partsWithEstimates(db: Db | Tx, requestId: string) {
  const rows = await db
    .select({ id: parts.id, name: parts.name, materialKey: parts.materialKey, quantity: parts.quantity, revisionId: parts.currentRevisionId })
    .from(parts)
    .where(eq(parts.requestId, requestId))
    .orderBy(asc(parts.sort));
  const revIds = rows.map((r) => r.revisionId).filter((x): x is string => Boolean(x));
  const done = revIds.length
    ? await db
        .select({ revisionId: analyses.revisionId, result: analyses.result, createdAt: analyses.createdAt })
        .from(analyses)
        .innerJoin(fileRevisions, eq(fileRevisions.id, analyses.revisionId))
        .where(and(inArray(analyses.revisionId, revIds), eq(analyses.status, "done")))
        .orderBy(desc(analyses.createdAt))
    : [];
  const latest = new Map<string, EstimateResult>();
  for (const a of done) if (!latest.has(a.revisionId) && a.result) latest.set(a.revisionId, a.result);
  return rows.map((r) => ({ ...r, estimate: r.revisionId ? (latest.get(r.revisionId) ?? null) : null }));
}

/** Blocks on a cell overlapping [from, to), with their order's reference for labels. */
export async function listCellBlocks(db: Db | Tx, cellKey: string, from: Date, to: Date) {
  return db
    .select({
      id: scheduleBlocks.id,
      orderId: scheduleBlocks.orderId,
      kind: scheduleBlocks.kind,
      startsAt: scheduleBlocks.startsAt,
      endsAt: scheduleBlocks.endsAt,
      reference: requests.reference,
      projectName: requests.projectName,
      stage: requests.stage,
    })
    .from(scheduleBlocks)
    .innerJoin(orders, eq(orders.id, scheduleBlocks.orderId))
    .innerJoin(requests, eq(requests.id, orders.requestId))
    .where(and(eq(scheduleBlocks.cellKey, cellKey), lt(scheduleBlocks.startsAt, to), gt(scheduleBlocks.endsAt, from)))
    .orderBy(asc(scheduleBlocks.startsAt));
}

/** Replace an order's blocks and planned dates (inside the scheduling transaction). */
export async function saveSchedule(
  tx: Tx,
  orderId: string,
  cellKey: string,
  blocks: { kind: "print" | "cooling" | "machining" | "finishing"; startsAt: Date; endsAt: Date }[],
  plannedShip: Date,
) {
  await tx.delete(scheduleBlocks).where(eq(scheduleBlocks.orderId, orderId));
  await tx.insert(scheduleBlocks).values(blocks.map((b) => ({ ...b, orderId, cellKey })));
  await tx.update(orders).set({ cellKey, plannedStart: blocks[0]!.startsAt, plannedShip }).where(eq(orders.id, orderId));
}

export interface ActualsWrite {
  actualPrintHours?: number | null;
  actualMaterialKg?: number | null;
  actualMachiningHours?: number | null;
  inspectionResult?: "pass" | "fail" | "conditional" | null;
  inspectionNotes?: string | null;
  carrier?: string | null;
  trackingNumber?: string | null;
}

export async function updateActuals(tx: Tx, orderId: string, w: ActualsWrite) {
  const set = Object.fromEntries(Object.entries(w).filter(([, v]) => v !== undefined));
  if (Object.keys(set).length) await tx.update(orders).set(set).where(eq(orders.id, orderId));
}

export async function getOrderById(db: Db | Tx, orderId: string) {
  const [o] = await db.select().from(orders).where(eq(orders.id, orderId));
  return o ?? null;
}

/** The balance invoice made when an order ships: one pending balance payment, made once. */
export async function ensureBalancePayment(tx: Tx, order: { id: string; orgId: string; balanceCents: number; currency: string }, actorId: string) {
  if (order.balanceCents <= 0) return null;
  const [existing] = await tx.select({ id: payments.id }).from(payments).where(and(eq(payments.orderId, order.id), eq(payments.kind, "balance")));
  if (existing) return existing.id;
  const [p] = await tx
    .insert(payments)
    .values({ orderId: order.id, orgId: order.orgId, kind: "balance", status: "pending", amountCents: order.balanceCents, currency: order.currency, createdById: actorId })
    .returning({ id: payments.id });
  return p!.id;
}

/** Orders with actuals recorded, for the actual-against-estimate report. */
export async function listOrdersWithActuals(db: Db) {
  return db
    .select({
      orderId: orders.id,
      requestId: requests.id,
      reference: requests.reference,
      projectName: requests.projectName,
      actualPrintHours: orders.actualPrintHours,
      actualMaterialKg: orders.actualMaterialKg,
      actualMachiningHours: orders.actualMachiningHours,
    })
    .from(orders)
    .innerJoin(requests, eq(requests.id, orders.requestId))
    .where(sql`${orders.actualPrintHours} is not null or ${orders.actualMaterialKg} is not null or ${orders.actualMachiningHours} is not null`);
}

/**
 * File an uploaded inspection report with the request's documents (the client's order page lists
 * it with the order's files). Filing the same upload again returns the document already filed.
 * Null when the upload is unknown or is not an inspection report.
 */
export async function attachInspectionReport(tx: Tx, input: { uploadId: string; requestId: string; orgId: string; userId: string }): Promise<{ documentId: string; fileName: string; isNew: boolean } | null> {
  const [up] = await tx.select().from(uploads).where(and(eq(uploads.id, input.uploadId), eq(uploads.purpose, "inspection_report")));
  if (!up) return null;
  const [filed] = await tx
    .select({ id: documents.id })
    .from(documents)
    .where(and(eq(documents.requestId, input.requestId), eq(documents.kind, "inspection_report"), eq(documents.fileKey, up.fileKey)));
  if (filed) return { documentId: filed.id, fileName: up.fileName, isNew: false };
  const [row] = await tx.insert(documents).values({
    requestId: input.requestId,
    orgId: input.orgId,
    kind: "inspection_report",
    title: `Inspection report — ${up.fileName}`,
    fileKey: up.fileKey,
    fileName: up.fileName,
    sizeBytes: up.sizeBytes,
    contentType: up.contentType,
    uploadedById: input.userId,
  }).returning({ id: documents.id });
  return { documentId: row!.id, fileName: up.fileName, isNew: true };
}

/** The inspection reports filed on a request, newest first (staff's order page). */
export async function listInspectionReports(db: Db | Tx, requestId: string) {
  return db
    .select({ id: documents.id, title: documents.title, fileName: documents.fileName, sizeBytes: documents.sizeBytes, createdAt: documents.createdAt })
    .from(documents)
    .where(and(eq(documents.requestId, requestId), eq(documents.kind, "inspection_report")))
    .orderBy(desc(documents.createdAt));
}
