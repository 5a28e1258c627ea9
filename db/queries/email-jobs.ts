import "server-only";
import { and, desc, eq, inArray, isNull, lt, lte, or, sql } from "drizzle-orm";
import type { Db } from "../client";
import { emailJobs, type EmailJob } from "../schema";

export type NewEmailJob = Pick<EmailJob, "toAddresses" | "subject" | "html" | "text" | "idempotencyKey"> & Partial<Pick<EmailJob, "tags" | "fromAddress" | "replyTo" | "attachments">>;

/** Queue an e-mail already claimed for its first attempt by the caller (status sending, attempt 1). */
export async function insertEmailJob(db: Db, job: NewEmailJob, now: Date, leaseMs: number): Promise<EmailJob> {
  const [row] = await db
    .insert(emailJobs)
    .values({ ...job, status: "sending", attempts: 1, leaseUntil: new Date(now.getTime() + leaseMs), nextAttemptAt: null })
    .returning();
  return row!;
}

/** Claim a due job for an attempt; one caller wins. */
export async function claimEmailJob(db: Db, id: string, now: Date, leaseMs: number): Promise<EmailJob | null> {
  const [row] = await db
    .update(emailJobs)
    .set({ status: "sending", attempts: sql`${emailJobs.attempts} + 1`, leaseUntil: new Date(now.getTime() + leaseMs) })
    .where(
      and(
        eq(emailJobs.id, id),
        or(and(eq(emailJobs.status, "queued"), or(isNull(emailJobs.nextAttemptAt), lte(emailJobs.nextAttemptAt, now))), and(eq(emailJobs.status, "sending"), lt(emailJobs.leaseUntil, now))),
      ),
    )
    .returning();
  return row ?? null;
}

export async function markEmailSent(db: Db, id: string, providerId: string, now: Date): Promise<void> {
  await db.update(emailJobs).set({ status: "sent", providerId, sentAt: now, leaseUntil: null, lastError: null }).where(eq(emailJobs.id, id));
}

export async function markEmailRetry(db: Db, id: string, nextAttemptAt: Date, lastError: string): Promise<void> {
  await db.update(emailJobs).set({ status: "queued", nextAttemptAt, leaseUntil: null, lastError }).where(eq(emailJobs.id, id));
}

export async function markEmailFailed(db: Db, id: string, lastError: string): Promise<void> {
  await db.update(emailJobs).set({ status: "failed", leaseUntil: null, nextAttemptAt: null, lastError }).where(eq(emailJobs.id, id));
}

/** Jobs due for an attempt: queued and due, or sending under an expired lease. */
export async function listDueEmailJobs(db: Db, now: Date, limit = 50): Promise<string[]> {
  const rows = await db
    .select({ id: emailJobs.id })
    .from(emailJobs)
    .where(or(and(eq(emailJobs.status, "queued"), or(isNull(emailJobs.nextAttemptAt), lte(emailJobs.nextAttemptAt, now))), and(eq(emailJobs.status, "sending"), lt(emailJobs.leaseUntil, now))))
    .limit(limit);
  return rows.map((r) => r.id);
}

/** Staff's "send again" of a failed e-mail: due at once, attempts from zero. */
export async function resetFailedEmailJob(db: Db, id: string): Promise<boolean> {
  const done = await db
    .update(emailJobs)
    .set({ status: "queued", attempts: 0, nextAttemptAt: null, lastError: null })
    .where(and(eq(emailJobs.id, id), eq(emailJobs.status, "failed")))
    .returning({ id: emailJobs.id });
  return done.length > 0;
}

/** E-mails not (yet) delivered, for the staff outbox: failed first, then waiting to retry. No bodies. */
export async function listUndeliveredEmails(db: Db, limit = 50) {
  return db
    .select({ id: emailJobs.id, toAddresses: emailJobs.toAddresses, subject: emailJobs.subject, status: emailJobs.status, attempts: emailJobs.attempts, nextAttemptAt: emailJobs.nextAttemptAt, lastError: emailJobs.lastError, createdAt: emailJobs.createdAt })
    .from(emailJobs)
    .where(or(eq(emailJobs.status, "failed"), and(inArray(emailJobs.status, ["queued", "sending"]), sql`${emailJobs.attempts} > 0`)))
    .orderBy(desc(emailJobs.status), desc(emailJobs.createdAt))
    .limit(limit);
}

/** Counts for the health route. */
export async function emailBacklog(db: Db): Promise<{ waiting: number; failed: number }> {
  const rows = await db.select({ status: emailJobs.status, n: sql<number>`count(*)` }).from(emailJobs).where(inArray(emailJobs.status, ["queued", "sending", "failed"])).groupBy(emailJobs.status);
  const n = (s: string) => Number(rows.find((r) => r.status === s)?.n ?? 0);
  return { waiting: n("queued") + n("sending"), failed: n("failed") };
}
