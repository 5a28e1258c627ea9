import "server-only";
import { and, eq, isNull, lt, or, sql } from "drizzle-orm";
import type { Db } from "../client";
import { analyses, fileRevisions, parts, requests } from "../schema";

/**
 * Claim an analysis to run it: queued, or running under an expired lease (its process died).
 * One caller wins; returns the attempt number now started, or null.
 */
export async function claimAnalysis(db: Db, id: string, now: Date, leaseMs: number): Promise<number | null> {
  const [row] = await db
    .update(analyses)
    .set({ status: "running", attempts: sql`${analyses.attempts} + 1`, leaseUntil: new Date(now.getTime() + leaseMs) })
    .where(
      and(
        eq(analyses.id, id),
        or(
          and(eq(analyses.status, "queued"), or(isNull(analyses.leaseUntil), lt(analyses.leaseUntil, now))),
          and(eq(analyses.status, "running"), lt(analyses.leaseUntil, now)),
        ),
      ),
    )
    .returning({ attempts: analyses.attempts });
  return row?.attempts ?? null;
}

/** Keep a running job's claim alive. */
export async function renewAnalysisLease(db: Db, id: string, now: Date, leaseMs: number): Promise<void> {
  await db.update(analyses).set({ leaseUntil: new Date(now.getTime() + leaseMs) }).where(and(eq(analyses.id, id), eq(analyses.status, "running")));
}

/** Put a job back in the queue, to be taken again from `notBefore` on. */
export async function requeueAnalysis(db: Db, id: string, notBefore: Date, stageLabel: string): Promise<void> {
  await db.update(analyses).set({ status: "queued", leaseUntil: notBefore, stageLabel }).where(eq(analyses.id, id));
}

/**
 * Jobs a sweeper should look at: running with an expired lease, or queued and due (a queued job
 * with no lease is normally being started by its request; `queuedGraceMs` leaves it that time).
 */
export async function listStrandedAnalyses(db: Db, now: Date, queuedGraceMs: number, limit = 50) {
  const graceCutoff = new Date(now.getTime() - queuedGraceMs);
  return db
    .select({ id: analyses.id, status: analyses.status, attempts: analyses.attempts })
    .from(analyses)
    .where(
      or(
        and(eq(analyses.status, "running"), or(isNull(analyses.leaseUntil), lt(analyses.leaseUntil, now))),
        and(eq(analyses.status, "queued"), lt(analyses.leaseUntil, now)),
        and(eq(analyses.status, "queued"), isNull(analyses.leaseUntil), lt(analyses.createdAt, graceCutoff)),
      ),
    )
    .limit(limit);
}

/** What a job needs to run: its file and options. */
export async function getAnalysisJob(db: Db, id: string) {
  const [row] = await db
    .select({ id: analyses.id, status: analyses.status, attempts: analyses.attempts, options: analyses.options, revisionId: analyses.revisionId, fileKey: fileRevisions.fileKey, fileName: fileRevisions.fileName, orgId: requests.orgId, ownerId: fileRevisions.uploadedById })
    .from(analyses)
    .innerJoin(fileRevisions, eq(fileRevisions.id, analyses.revisionId))
    .innerJoin(parts, eq(parts.id, fileRevisions.partId))
    .innerJoin(requests, eq(requests.id, parts.requestId))
    .where(eq(analyses.id, id));
  return row ?? null;
}

/** A failed job made new again (staff's retry): attempts from zero. Only failed jobs. */
export async function resetFailedAnalysis(db: Db, id: string): Promise<boolean> {
  const done = await db
    .update(analyses)
    .set({ status: "queued", attempts: 0, leaseUntil: null, progress: 0, stageLabel: "Queued again", errorCode: null, errorMessage: null, finishedAt: null })
    .where(and(eq(analyses.id, id), eq(analyses.status, "failed")))
    .returning({ id: analyses.id });
  return done.length > 0;
}

/** Record the file's SHA-256 the worker computed (it reads the whole file; the request thread does not). */
export async function setRevisionSha256(db: Db, revisionId: string, sha256: string): Promise<void> {
  await db.update(fileRevisions).set({ sha256 }).where(and(eq(fileRevisions.id, revisionId), isNull(fileRevisions.sha256)));
}

/** One analysis with the firm and author of its request (to scope who may read it), or undefined. */
export async function getAnalysisWithScope(db: Db, id: string) {
  const [row] = await db
    .select({ analysis: analyses, orgId: requests.orgId, createdById: requests.createdById, partId: parts.id })
    .from(analyses)
    .innerJoin(fileRevisions, eq(fileRevisions.id, analyses.revisionId))
    .innerJoin(parts, eq(parts.id, fileRevisions.partId))
    .innerJoin(requests, eq(requests.id, parts.requestId))
    .where(eq(analyses.id, id));
  return row;
}
