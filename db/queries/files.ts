import "server-only";
import { and, desc, eq, max, sql } from "drizzle-orm";
import type { Db } from "../client";
import { documents, fileRevisions, parts, requests, uploads } from "../schema";
import type { Tx } from "./audit";

export async function recordUpload(db: Db | Tx, input: typeof uploads.$inferInsert) {
  const [row] = await db
    .insert(uploads)
    .values(input)
    .onConflictDoUpdate({ target: uploads.fileKey, set: { fileName: input.fileName, sizeBytes: input.sizeBytes, url: input.url } })
    .returning({ id: uploads.id });
  return row!;
}

export async function getUpload(db: Db | Tx, uploadId: string) {
  const [row] = await db.select().from(uploads).where(eq(uploads.id, uploadId));
  return row ?? null;
}

/** Add the next revision of a part's file and make it current. */
export async function addFileRevision(
  tx: Db | Tx,
  input: { partId: string; uploadId: string; fileKey: string; fileName: string; sizeBytes: number; sha256: string | null; format: string; uploadedById: string },
) {
  const [last] = await tx.select({ n: max(fileRevisions.revision) }).from(fileRevisions).where(eq(fileRevisions.partId, input.partId));
  const revision = (last?.n ?? 0) + 1;
  const [row] = await tx
    .insert(fileRevisions)
    .values({ ...input, revision })
    .returning({ id: fileRevisions.id, revision: fileRevisions.revision });
  await tx.update(parts).set({ currentRevisionId: row!.id }).where(eq(parts.id, input.partId));
  return row!;
}

export async function getRevision(db: Db | Tx, revisionId: string) {
  const [row] = await db.select().from(fileRevisions).where(eq(fileRevisions.id, revisionId));
  return row ?? null;
}

export async function listRevisionsForPart(db: Db | Tx, partId: string) {
  return db
    .select({ id: fileRevisions.id, revision: fileRevisions.revision, fileName: fileRevisions.fileName, sizeBytes: fileRevisions.sizeBytes, format: fileRevisions.format, createdAt: fileRevisions.createdAt })
    .from(fileRevisions)
    .where(eq(fileRevisions.partId, partId))
    .orderBy(desc(fileRevisions.revision));
}

/**
 * Everything the download route needs to decide on one stored file, by our id (a file revision,
 * a document or a bare upload): its storage key, and which request (so which firm, and whether
 * controlled) it belongs to, or the uploader when it is not attached yet.
 */
export async function findStoredFile(db: Db, id: string) {
  const [rev] = await db
    .select({
      fileKey: fileRevisions.fileKey,
      fileName: fileRevisions.fileName,
      sizeBytes: fileRevisions.sizeBytes,
      requestId: requests.id,
      orgId: requests.orgId,
      createdById: requests.createdById,
      isControlled: requests.isControlled,
      // Bodies the client chose to print, when this is the part's current file.
      selectedBodies: sql<string | null>`case when ${parts.currentRevisionId} = ${fileRevisions.id} then ${parts.selectedBodies} end`,
    })
    .from(fileRevisions)
    .innerJoin(parts, eq(parts.id, fileRevisions.partId))
    .innerJoin(requests, eq(requests.id, parts.requestId))
    .where(eq(fileRevisions.id, id));
  if (rev) return { kind: "revision" as const, ...rev, contentType: null as string | null, uploaderId: null as string | null };
  const [doc] = await db
    .select({ fileKey: documents.fileKey, fileName: documents.fileName, sizeBytes: documents.sizeBytes, contentType: documents.contentType, requestId: requests.id, orgId: requests.orgId, createdById: requests.createdById, isControlled: requests.isControlled })
    .from(documents)
    .innerJoin(requests, eq(requests.id, documents.requestId))
    .where(eq(documents.id, id));
  if (doc?.fileKey) return { kind: "document" as const, ...doc, fileKey: doc.fileKey, fileName: doc.fileName ?? "document", uploaderId: null as string | null };
  const [up] = await db
    .select({ fileKey: uploads.fileKey, fileName: uploads.fileName, sizeBytes: uploads.sizeBytes, contentType: uploads.contentType, orgId: uploads.orgId, uploaderId: uploads.userId })
    .from(uploads)
    .where(eq(uploads.id, id));
  if (up) return { kind: "upload" as const, ...up, requestId: null as string | null, createdById: undefined as string | undefined, isControlled: false };
  return null;
}

/** The upload row by our id (the browser only ever knows our ids). */
export async function getUploadOwned(db: Db, uploadId: string, userId: string) {
  const [row] = await db.select().from(uploads).where(and(eq(uploads.id, uploadId), eq(uploads.userId, userId)));
  return row ?? null;
}
