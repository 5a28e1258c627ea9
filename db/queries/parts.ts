import { and, asc, desc, eq, inArray, notInArray } from "drizzle-orm";
import type { Db } from "../client";
import { analyses, fileRevisions, parts } from "../schema";
import type { Tx } from "./audit";

export async function listParts(db: Db | Tx, requestId: string) {
  return db.select().from(parts).where(eq(parts.requestId, requestId)).orderBy(asc(parts.sort), asc(parts.createdAt));
}

export async function getPart(db: Db | Tx, partId: string) {
  const [row] = await db.select().from(parts).where(eq(parts.id, partId));
  return row ?? null;
}

export async function createPart(db: Db | Tx, input: typeof parts.$inferInsert) {
  const [row] = await db.insert(parts).values(input).returning();
  return row!;
}

export async function updatePart(db: Db | Tx, requestId: string, partId: string, fields: Partial<typeof parts.$inferInsert>) {
  const rows = await db
    .update(parts)
    .set(fields)
    .where(and(eq(parts.id, partId), eq(parts.requestId, requestId)))
    .returning({ id: parts.id });
  return rows.length === 1;
}

export async function deletePart(db: Db | Tx, requestId: string, partId: string) {
  await db.delete(parts).where(and(eq(parts.id, partId), eq(parts.requestId, requestId)));
}

export async function createAnalysis(db: Db | Tx, input: { revisionId: string; options: Record<string, unknown>; rateCardId: string | null }) {
  const [row] = await db.insert(analyses).values({ ...input, status: "queued" }).returning({ id: analyses.id });
  return row!;
}

export async function updateAnalysis(db: Db | Tx, analysisId: string, fields: Partial<typeof analyses.$inferInsert>) {
  await db.update(analyses).set(fields).where(eq(analyses.id, analysisId));
}

export async function getAnalysis(db: Db | Tx, analysisId: string) {
  const [row] = await db.select().from(analyses).where(eq(analyses.id, analysisId));
  return row ?? null;
}

/** The latest analysis of each given revision. */
export async function latestAnalyses(db: Db | Tx, revisionIds: string[]) {
  if (revisionIds.length === 0) return new Map<string, typeof analyses.$inferSelect>();
  const rows = await db.select().from(analyses).where(inArray(analyses.revisionId, revisionIds)).orderBy(desc(analyses.createdAt));
  const out = new Map<string, typeof analyses.$inferSelect>();
  for (const r of rows) if (!out.has(r.revisionId)) out.set(r.revisionId, r);
  return out;
}

/** Parts with their current revision and its latest analysis (status, progress, result). */
export async function listPartsWithAnalysis(db: Db | Tx, requestId: string) {
  const ps = await listParts(db, requestId);
  const revIds = ps.map((p) => p.currentRevisionId).filter((x): x is string => Boolean(x));
  const revs = revIds.length
    ? await db
        .select({ id: fileRevisions.id, revision: fileRevisions.revision, fileName: fileRevisions.fileName, sizeBytes: fileRevisions.sizeBytes, format: fileRevisions.format, createdAt: fileRevisions.createdAt })
        .from(fileRevisions)
        .where(inArray(fileRevisions.id, revIds))
    : [];
  const an = await latestAnalyses(db, revIds);
  return ps.map((p) => {
    const revision = revs.find((r) => r.id === p.currentRevisionId) ?? null;
    const a = revision ? (an.get(revision.id) ?? null) : null;
    return {
      part: p,
      revision,
      analysis: a
        ? { id: a.id, status: a.status, progress: a.progress, stageLabel: a.stageLabel, errorCode: a.errorCode, errorMessage: a.errorMessage, result: a.result, options: a.options, createdAt: a.createdAt }
        : null,
    };
  });
}
export type PartWithAnalysis = Awaited<ReturnType<typeof listPartsWithAnalysis>>[number];

/** Delete a request's parts that are not in `keepIds` (all of them when it is empty). */
export async function deletePartsNotIn(db: Db | Tx, requestId: string, keepIds: string[]) {
  await db.delete(parts).where(and(eq(parts.requestId, requestId), keepIds.length ? notInArray(parts.id, keepIds) : undefined));
}
