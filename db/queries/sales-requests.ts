import "server-only";
import { and, asc, desc, eq, inArray, or, sql } from "drizzle-orm";
import type { Db } from "../client";
import { analyses, fileRevisions, organisations, parts, quotes, requests } from "../schema";
import type { Tx } from "./audit";

/** Sales' side of a request: the inbox of requests waiting for a quote, and one request as sales reads it. */

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
