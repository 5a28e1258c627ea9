import { asc, eq, inArray } from "drizzle-orm";
import type { Db } from "../client";
import { reconciliationNotes, users } from "../schema";
import type { Tx } from "./audit";

/** The notes on these findings, oldest first, with their authors' names. */
export async function listNotesFor(db: Db | Tx, findingKeys: string[]) {
  if (findingKeys.length === 0) return [];
  return db
    .select({ findingKey: reconciliationNotes.findingKey, note: reconciliationNotes.note, isResolved: reconciliationNotes.isResolved, createdAt: reconciliationNotes.createdAt, author: users.name })
    .from(reconciliationNotes)
    .leftJoin(users, eq(users.id, reconciliationNotes.authorId))
    .where(inArray(reconciliationNotes.findingKey, findingKeys))
    .orderBy(asc(reconciliationNotes.createdAt));
}

export async function createNote(db: Db | Tx, v: { findingKey: string; note: string; isResolved: boolean; authorId: string }) {
  const [row] = await db.insert(reconciliationNotes).values(v).returning({ id: reconciliationNotes.id });
  return row!.id;
}
