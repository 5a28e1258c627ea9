import { asc, eq } from "drizzle-orm";
import type { Db } from "../client";
import { documents, messages, users } from "../schema";

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

export async function getMessage(db: Db, id: string) {
  const [row] = await db.select().from(messages).where(eq(messages.id, id));
  return row ?? null;
}
