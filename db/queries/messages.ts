import "server-only";
import { and, asc, eq, inArray, isNull, or } from "drizzle-orm";
import type { Db } from "../client";
import type { Tx } from "./audit";
import { documents, memberships, messages, requests, users } from "../schema";

export async function listMessages(db: Db, requestId: string) {
  const rows = await db
    .select({ id: messages.id, parentId: messages.parentId, body: messages.body, isFromStaff: messages.isFromStaff, createdAt: messages.createdAt, authorName: users.name, authorEmail: users.email })
    .from(messages)
    .innerJoin(users, eq(users.id, messages.authorId))
    .where(eq(messages.requestId, requestId))
    .orderBy(asc(messages.createdAt));
  const atts = await db
    .select({ id: documents.id, messageId: documents.messageId, title: documents.title, sizeBytes: documents.sizeBytes })
    .from(documents)
    .where(eq(documents.requestId, requestId));
  return rows.map((m) => ({ ...m, attachments: atts.filter((a) => a.messageId === m.id) }));
}
export type ThreadMessage = Awaited<ReturnType<typeof listMessages>>[number];

export async function createMessage(db: Db, input: typeof messages.$inferInsert) {
  const [row] = await db.insert(messages).values(input).returning({ id: messages.id });
  return row!;
}

/** One message with its author's display name (for the e-mail notice). */
export async function getMessageWithAuthor(db: Db, id: string) {
  const [row] = await db
    .select({ id: messages.id, requestId: messages.requestId, isFromStaff: messages.isFromStaff, body: messages.body, authorName: users.name })
    .from(messages)
    .innerJoin(users, eq(users.id, messages.authorId))
    .where(eq(messages.id, id));
  return row ?? null;
}

export async function getMessage(db: Db, id: string) {
  const [row] = await db.select().from(messages).where(eq(messages.id, id));
  return row ?? null;
}

/**
 * The clients on a request's thread: whoever created it and every client who posted on it,
 * still members of the request's firm and not disabled. Lower-cased, de-duplicated.
 */
export async function listThreadClientEmails(db: Db, requestId: string): Promise<string[]> {
  const [req] = await db.select({ orgId: requests.orgId, createdById: requests.createdById }).from(requests).where(eq(requests.id, requestId));
  if (!req) return [];
  const posters = db.select({ id: messages.authorId }).from(messages).where(and(eq(messages.requestId, requestId), eq(messages.isFromStaff, false)));
  const rows = await db
    .select({ email: users.email })
    .from(users)
    .innerJoin(memberships, and(eq(memberships.userId, users.id), eq(memberships.orgId, req.orgId)))
    .where(and(isNull(users.disabledAt), or(eq(users.id, req.createdById), inArray(users.id, posters))));
  return [...new Set(rows.map((r) => r.email.toLowerCase()))].sort();
}

/** A message from the bureau on a request's thread. */
export async function createStaffMessage(tx: Tx, input: { requestId: string; orgId: string; authorId: string; body: string }) {
  const [m] = await tx.insert(messages).values({ ...input, isFromStaff: true }).returning({ id: messages.id });
  return m!;
}
