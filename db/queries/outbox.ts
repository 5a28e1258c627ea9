import "server-only";
import { desc, eq } from "drizzle-orm";
import type { Db } from "../client";
import { emailOutbox, type NewOutboxMessage } from "../schema";

export async function createOutboxMessage(db: Db, message: NewOutboxMessage) {
  const [row] = await db.insert(emailOutbox).values(message).returning({ id: emailOutbox.id });
  return row!;
}

export async function listOutboxMessages(db: Db, limit = 100) {
  return db
    .select({
      id: emailOutbox.id,
      fromAddress: emailOutbox.fromAddress,
      toAddresses: emailOutbox.toAddresses,
      subject: emailOutbox.subject,
      createdAt: emailOutbox.createdAt,
    })
    .from(emailOutbox)
    .orderBy(desc(emailOutbox.createdAt))
    .limit(limit);
}

export async function getOutboxMessage(db: Db, id: string) {
  const [row] = await db.select().from(emailOutbox).where(eq(emailOutbox.id, id));
  return row ?? null;
}
