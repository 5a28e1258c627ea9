import "server-only";
import { getDb, type Db } from "../../db/client";
import { claimEmailJob, insertEmailJob, listDueEmailJobs, markEmailFailed, markEmailRetry, markEmailSent, resetFailedEmailJob } from "../../db/queries/email-jobs";
import { createOutboxMessage } from "../../db/queries/outbox";
import type { EmailJob } from "../../db/schema";
import { env } from "../env";
import { errorFields, logFor } from "../observability/log";
import { attachmentRecords, EmailSendError, renderEmail, sendRenderedEmail, type SendEmailInput } from "./send";

/** Attempts before an e-mail is given up on and shown to staff as failed. */
export const MAX_EMAIL_ATTEMPTS = 8;
const LEASE_MS = 60_000;

/** Wait after the n-th failed attempt: 1, 2, 4 … minutes, at most 2 hours (about 4 h in all over 8 attempts). */
export function emailBackoffMs(failedAttempts: number): number {
  return Math.min(2 * 60 * 60_000, 60_000 * 2 ** Math.max(0, failedAttempts - 1));
}

/** Refusals that a later attempt will not change (a malformed address, a forbidden sender). */
export function isPermanentEmailError(e: unknown): boolean {
  if (!(e instanceof EmailSendError)) return false;
  return e.statusCode !== null && e.statusCode >= 400 && e.statusCode < 500 && e.statusCode !== 408 && e.statusCode !== 429;
}

export interface EmailDeps {
  send?: typeof sendRenderedEmail;
  now?: () => Date;
}

/**
 * Queue an e-mail and try it at once. Never throws for the e-mail API's failures: the job stays
 * and is tried again with back-off (the sweeper), so a notice is never lost; it throws only if
 * the job cannot be stored.
 */
export async function queueEmail(input: SendEmailInput, db: Db = getDb(), deps: EmailDeps = {}): Promise<{ jobId: string; sent: boolean }> {
  const now = (deps.now ?? (() => new Date()))();
  const { html, text } = await renderEmail(input);
  const to = Array.isArray(input.to) ? input.to : [input.to];
  const job = await insertEmailJob(
    db,
    {
      toAddresses: to,
      subject: input.subject,
      html,
      text,
      tags: input.tags ?? null,
      attachments: input.attachments?.length ? input.attachments.map((a) => ({ filename: a.filename, contentType: a.contentType ?? null, contentBase64: a.content.toString("base64") })) : null,
      fromAddress: input.from ?? null,
      replyTo: input.replyTo ? (Array.isArray(input.replyTo) ? input.replyTo : [input.replyTo]) : null,
      idempotencyKey: input.idempotencyKey ?? `email-job/${crypto.randomUUID()}`,
    },
    now,
    LEASE_MS,
  );
  return { jobId: job.id, sent: await attempt(db, job, deps) };
}

/** One attempt of a claimed job; records the outcome. True when sent. */
async function attempt(db: Db, job: EmailJob, deps: EmailDeps): Promise<boolean> {
  const now = deps.now ?? (() => new Date());
  const log = logFor({ emailJobId: job.id, template: job.tags?.find((t) => t.name === "template")?.value });
  const attachments = job.attachments?.map((a) => ({ filename: a.filename, contentType: a.contentType, content: Buffer.from(a.contentBase64, "base64") })) ?? null;
  try {
    const { id } = await (deps.send ?? sendRenderedEmail)({
      to: job.toAddresses,
      subject: job.subject,
      html: job.html,
      text: job.text,
      tags: job.tags,
      from: job.fromAddress,
      replyTo: job.replyTo,
      idempotencyKey: job.idempotencyKey,
      attachments,
    });
    await markEmailSent(db, job.id, id, now());
    // The back office's list of sent mail (as sendEmail keeps it); a failure here loses only that copy.
    await createOutboxMessage(db, { providerId: id, fromAddress: job.fromAddress ?? env().EMAIL_FROM, toAddresses: job.toAddresses, subject: job.subject, html: job.html, text: job.text, tags: job.tags ?? [], attachments: attachmentRecords(attachments) }).catch((e: unknown) =>
      log.error({ ...errorFields(e), event: "email.outbox_copy" }, "e-mail sent but not written to the outbox"),
    );
    if (job.attempts > 1) log.info({ event: "email.sent", attempts: job.attempts }, "e-mail sent after retries");
    return true;
  } catch (e) {
    const message = (e as Error).message.slice(0, 500);
    if (isPermanentEmailError(e) || job.attempts >= MAX_EMAIL_ATTEMPTS) {
      await markEmailFailed(db, job.id, message);
      log.error({ ...errorFields(e), event: "email.failed", attempts: job.attempts }, "e-mail failed; staff can send it again from the outbox");
    } else {
      await markEmailRetry(db, job.id, new Date(now().getTime() + emailBackoffMs(job.attempts)), message);
      log.warn({ event: "email.retry", attempts: job.attempts, message }, "e-mail not sent; will retry");
    }
    return false;
  }
}

/** Try every due e-mail once (the sweeper, on start and on a timer). */
export async function sweepEmails(db: Db = getDb(), deps: EmailDeps = {}): Promise<{ attempted: number; sent: number }> {
  const now = (deps.now ?? (() => new Date()))();
  let attempted = 0;
  let sent = 0;
  for (const id of await listDueEmailJobs(db, now)) {
    const job = await claimEmailJob(db, id, now, LEASE_MS);
    if (!job) continue;
    attempted += 1;
    if (await attempt(db, job, deps)) sent += 1;
  }
  return { attempted, sent };
}

/** Staff's "send again" of a failed e-mail: attempts from zero, tried at once. */
export async function resendFailedEmail(db: Db, jobId: string, deps: EmailDeps = {}): Promise<{ reset: boolean; sent: boolean }> {
  if (!(await resetFailedEmailJob(db, jobId))) return { reset: false, sent: false };
  const job = await claimEmailJob(db, jobId, (deps.now ?? (() => new Date()))(), LEASE_MS);
  return { reset: true, sent: job ? await attempt(db, job, deps) : false };
}
