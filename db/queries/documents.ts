import "server-only";
import { desc, eq } from "drizzle-orm";
import type { Db } from "../client";
import { documents } from "../schema";
import type { Tx } from "./audit";

/** A request's documents (reports, invoices, quote pages, attachments), newest first. */
export async function listDocuments(db: Db, requestId: string) {
  return db
    .select({ id: documents.id, kind: documents.kind, title: documents.title, fileName: documents.fileName, sizeBytes: documents.sizeBytes, hasFile: documents.fileKey, messageId: documents.messageId, createdAt: documents.createdAt })
    .from(documents)
    .where(eq(documents.requestId, requestId))
    .orderBy(desc(documents.createdAt));
}

export async function createDocument(db: Db | Tx, input: typeof documents.$inferInsert) {
  const [row] = await db.insert(documents).values(input).returning({ id: documents.id });
  return row!;
}
