import { and, desc, eq, gt } from "drizzle-orm";
import type { Db } from "../client";
import { organisations, taxExemptions, uploads, type TaxExemption } from "../schema";
import type { Tx } from "./audit";

type Q = Db | Tx;

/** The firm's certificate that frees it of tax now: approved and not expired (the latest such). */
export async function getValidExemption(q: Q, orgId: string, now: Date): Promise<TaxExemption | null> {
  const [row] = await q
    .select()
    .from(taxExemptions)
    .where(and(eq(taxExemptions.orgId, orgId), eq(taxExemptions.status, "approved"), gt(taxExemptions.expiresOn, now)))
    .orderBy(desc(taxExemptions.expiresOn))
    .limit(1);
  return row ?? null;
}

/** The firm's certificates, newest first. */
export async function listExemptions(q: Q, orgId: string) {
  return q
    .select({ e: taxExemptions, fileName: uploads.fileName })
    .from(taxExemptions)
    .leftJoin(uploads, eq(uploads.id, taxExemptions.uploadId))
    .where(eq(taxExemptions.orgId, orgId))
    .orderBy(desc(taxExemptions.createdAt));
}

/** Every firm's certificates waiting for accounts, and the rest, with the firm's name. */
export async function listAllExemptions(q: Q) {
  return q
    .select({ e: taxExemptions, firm: organisations.name, fileName: uploads.fileName })
    .from(taxExemptions)
    .innerJoin(organisations, eq(organisations.id, taxExemptions.orgId))
    .leftJoin(uploads, eq(uploads.id, taxExemptions.uploadId))
    .orderBy(desc(taxExemptions.createdAt));
}

export async function getExemption(q: Q, id: string) {
  const [row] = await q.select().from(taxExemptions).where(eq(taxExemptions.id, id));
  return row ?? null;
}

export async function createExemption(tx: Tx, input: { orgId: string; certificateNumber: string; issuedBy: string; expiresOn: Date; uploadId: string | null; uploadedById: string }) {
  const [row] = await tx.insert(taxExemptions).values(input).returning();
  return row!;
}

/** Accounts' decision on a pending certificate; false when it was decided already. */
export async function reviewExemption(tx: Tx, input: { id: string; status: "approved" | "rejected"; note: string | null; reviewerId: string; now: Date }) {
  const r = await tx
    .update(taxExemptions)
    .set({ status: input.status, reviewNote: input.note, reviewedById: input.reviewerId, reviewedAt: input.now })
    .where(and(eq(taxExemptions.id, input.id), eq(taxExemptions.status, "pending")))
    .returning({ id: taxExemptions.id });
  return r.length === 1;
}
