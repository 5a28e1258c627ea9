import "server-only";
import { and, eq, like, sql } from "drizzle-orm";
import type { Db } from "../client";
import { requests } from "../schema";
import type { Tx } from "./audit";

/** Draft requests: a new one with the next free reference, its fields while it is a draft, its last change. */

/** Next free reference of the form LW-YYYY-NNNN. */
async function nextReference(db: Db | Tx, now: Date): Promise<string> {
  const prefix = `LW-${now.getUTCFullYear()}-`;
  const [row] = await db
    .select({ max: sql<string | null>`max(${requests.reference})` })
    .from(requests)
    .where(like(requests.reference, `${prefix}%`));
  const last = row?.max ? Number(row.max.slice(prefix.length)) : 0;
  return `${prefix}${String((Number.isFinite(last) ? last : 0) + 1).padStart(4, "0")}`;
}

export interface DraftFields {
  projectName: string;
  neededBy: Date | null;
  cureProcess: "room" | "oven" | "autoclave";
  cureTempC: number | null;
  partCtePpmPerK: number | null;
  isControlled: boolean;
  leadTime: "standard" | "expedite" | "economy";
  notes: string;
}

/** A new draft request for this user's firm. Retries the reference if another draft took it. */
export async function createDraftRequest(db: Db, input: { orgId: string; createdById: string; fields: DraftFields; now?: Date }) {
  const now = input.now ?? new Date();
  for (let attempt = 0; ; attempt++) {
    const reference = await nextReference(db, now);
    try {
      const [row] = await db
        .insert(requests)
        .values({ ...input.fields, reference, orgId: input.orgId, createdById: input.createdById, stage: "draft", createdAt: now, updatedAt: now })
        .returning({ id: requests.id, reference: requests.reference });
      return row!;
    } catch (e) {
      if (attempt >= 4 || !String((e as Error).message).includes("UNIQUE")) throw e;
    }
  }
}

/** Update a draft's fields; only while it is a draft (the WHERE holds the stage). */
export async function updateDraftRequest(db: Db | Tx, requestId: string, fields: Partial<DraftFields>) {
  const rows = await db
    .update(requests)
    .set({ ...fields, updatedAt: new Date() })
    .where(and(eq(requests.id, requestId), eq(requests.stage, "draft")))
    .returning({ id: requests.id });
  return rows.length === 1;
}

export async function touchRequest(db: Db | Tx, requestId: string) {
  await db.update(requests).set({ updatedAt: new Date() }).where(eq(requests.id, requestId));
}
