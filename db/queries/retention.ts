import "server-only";
import { and, eq, inArray, isNull, lt, ne, or, sql } from "drizzle-orm";
import type { Db } from "../client";
import { bureauSettings, DEFAULT_MODEL_RETENTION_DAYS, FINISHED_STAGES, fileRetention, fileRevisions, parts, requests, type FileRetention } from "../schema";
import { writeAudit } from "./audit";

const BUREAU = "bureau";

export async function getBureauSettings(db: Db): Promise<{ modelRetentionDays: number; retentionRunOn: string | null }> {
  const [row] = await db.select().from(bureauSettings).where(eq(bureauSettings.id, BUREAU));
  return { modelRetentionDays: row?.modelRetentionDays ?? DEFAULT_MODEL_RETENTION_DAYS, retentionRunOn: row?.retentionRunOn ?? null };
}

/** Change the retention period; audited with the old and new values. */
export async function setModelRetentionDays(db: Db, input: { days: number; actorId: string; now: Date }): Promise<void> {
  await db.transaction(async (tx) => {
    const [row] = await tx.select({ days: bureauSettings.modelRetentionDays }).from(bureauSettings).where(eq(bureauSettings.id, BUREAU));
    await tx
      .insert(bureauSettings)
      .values({ id: BUREAU, modelRetentionDays: input.days, updatedById: input.actorId, updatedAt: input.now })
      .onConflictDoUpdate({ target: bureauSettings.id, set: { modelRetentionDays: input.days, updatedById: input.actorId, updatedAt: input.now } });
    await writeAudit(tx, {
      actorId: input.actorId,
      action: "settings.model_retention",
      entityType: "bureau_settings",
      entityId: BUREAU,
      before: { modelRetentionDays: row?.days ?? DEFAULT_MODEL_RETENTION_DAYS },
      after: { modelRetentionDays: input.days },
    });
  });
}

/** Claim today's retention run; true for exactly one caller per UTC day, however many processes ask. */
export async function claimRetentionRun(db: Db, day: string): Promise<boolean> {
  await db.insert(bureauSettings).values({ id: BUREAU }).onConflictDoNothing();
  const claimed = await db
    .update(bureauSettings)
    .set({ retentionRunOn: day })
    .where(and(eq(bureauSettings.id, BUREAU), or(isNull(bureauSettings.retentionRunOn), lt(bureauSettings.retentionRunOn, day))))
    .returning({ id: bureauSettings.id });
  return claimed.length > 0;
}

export interface FinishedRequest {
  requestId: string;
  orgId: string;
  reference: string;
  finishedAt: Date | null;
  deletionRequestedAt: Date | null;
}

/** Closed or cancelled requests whose model files are still stored, with when they finished. */
export async function listFinishedRequestsWithFiles(db: Db, limit = 500): Promise<FinishedRequest[]> {
  const rows = await db
    .select({
      requestId: requests.id,
      orgId: requests.orgId,
      reference: requests.reference,
      finishedAtMs: sql<number | null>`(select max(se.at) from stage_events se where se.request_id = ${requests.id} and se.to_stage = ${requests.stage})`,
      deletionRequestedAt: fileRetention.deletionRequestedAt,
    })
    .from(requests)
    .leftJoin(fileRetention, eq(fileRetention.requestId, requests.id))
    .where(and(inArray(requests.stage, [...FINISHED_STAGES]), isNull(fileRetention.filesDeletedAt)))
    .limit(limit);
  return rows.map((r) => ({ ...r, finishedAt: r.finishedAtMs === null ? null : new Date(Number(r.finishedAtMs)) }));
}

/**
 * Storage keys of a request's model files that no other request still uses (a file sent again
 * with another request stays until that one's files go too).
 */
export async function deletableModelFileKeys(db: Db, requestId: string): Promise<string[]> {
  const own = await db
    .selectDistinct({ key: fileRevisions.fileKey })
    .from(fileRevisions)
    .innerJoin(parts, eq(parts.id, fileRevisions.partId))
    .where(eq(parts.requestId, requestId));
  const keys = own.map((r) => r.key);
  if (keys.length === 0) return [];
  const shared = await db
    .selectDistinct({ key: fileRevisions.fileKey })
    .from(fileRevisions)
    .innerJoin(parts, eq(parts.id, fileRevisions.partId))
    .leftJoin(fileRetention, eq(fileRetention.requestId, parts.requestId))
    .where(and(inArray(fileRevisions.fileKey, keys), ne(parts.requestId, requestId), isNull(fileRetention.filesDeletedAt)));
  const keep = new Set(shared.map((r) => r.key));
  return keys.filter((k) => !keep.has(k));
}

/** Record that a request's model files were deleted from storage; audited. The records stay. */
export async function markRequestFilesDeleted(
  db: Db,
  input: { requestId: string; orgId: string; count: number; now: Date; actorId: string | null; reason: "retention" | "client_request" },
): Promise<void> {
  await db.transaction(async (tx) => {
    await tx
      .insert(fileRetention)
      .values({ requestId: input.requestId, filesDeletedAt: input.now, filesDeletedCount: input.count })
      .onConflictDoUpdate({ target: fileRetention.requestId, set: { filesDeletedAt: input.now, filesDeletedCount: input.count } });
    await writeAudit(tx, {
      actorId: input.actorId,
      action: "files.deleted",
      entityType: "request",
      entityId: input.requestId,
      orgId: input.orgId,
      after: { files: input.count, reason: input.reason },
    });
  });
}

/** A client admin asks for a finished order's model files to go now; audited. */
export async function recordDeletionRequest(db: Db, input: { requestId: string; orgId: string; userId: string; now: Date }): Promise<void> {
  await db.transaction(async (tx) => {
    await tx
      .insert(fileRetention)
      .values({ requestId: input.requestId, deletionRequestedAt: input.now, deletionRequestedById: input.userId })
      .onConflictDoUpdate({ target: fileRetention.requestId, set: { deletionRequestedAt: input.now, deletionRequestedById: input.userId } });
    await writeAudit(tx, { actorId: input.userId, action: "files.deletion_requested", entityType: "request", entityId: input.requestId, orgId: input.orgId });
  });
}

export async function getFileRetention(db: Db, requestId: string): Promise<FileRetention | null> {
  const [row] = await db.select().from(fileRetention).where(eq(fileRetention.requestId, requestId));
  return row ?? null;
}
