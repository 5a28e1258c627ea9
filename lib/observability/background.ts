import "server-only";
import { getDb } from "../../db/client";
import { claimRetentionRun } from "../../db/queries/retention";
import { sweepAnalyses } from "../analysis/run";
import { sweepEmails } from "../email/outbox";
import { utcDay } from "../retention/policy";
import { runRetention } from "../retention/run";
import { runTermsNotices } from "../payments/dunning";
import { notifyInvoiceReminder } from "../email/notify";
import { deleteStoredFiles } from "../uploads/uploadthing";
import { errorFields, rootLogger } from "./log";

const globalForBackground = globalThis as unknown as { layerwrightBackground?: boolean };

/** How often each process looks for analyses whose process died and e-mails due another attempt, ms. */
const SWEEP_MS = 30_000;
/** How often each process looks whether today's retention run is still to do, ms. */
const RETENTION_CHECK_MS = 60 * 60 * 1000;

/**
 * Timers each server process runs beside the requests, started once per process from
 * instrumentation.ts. The work is safe to run in several processes at once: a conditional update
 * in SQLite decides which one does it.
 */
export function startBackgroundWork(): void {
  if (globalForBackground.layerwrightBackground || process.env.LAYERWRIGHT_NO_BACKGROUND === "1") return;
  globalForBackground.layerwrightBackground = true;
  const log = rootLogger().child({ component: "background" });
  const retention = async () => {
    try {
      const now = new Date();
      const db = getDb();
      // Invoice reminders are claimed one by one, so every hourly pass may look.
      const notices = await runTermsNotices(db, now, (orderId, which) => notifyInvoiceReminder(orderId, which, db));
      if (notices.reminders.length || notices.overdue.length) log.info({ event: "invoice.notices", reminders: notices.reminders.length, overdue: notices.overdue.length }, "invoice reminders and overdue notices queued");
      if (!(await claimRetentionRun(db, utcDay(now)))) return;
      const summary = await runRetention(db, { now, deleteStoredFiles });
      log.info({ event: "retention.run", requests: summary.requests, files: summary.files, failed: summary.failed.length }, "retention run");
      for (const f of summary.failed) log.warn({ event: "retention.failed", requestId: f.requestId, message: f.message }, "model files not deleted; retried tomorrow");
    } catch (e) {
      log.error({ ...errorFields(e), event: "retention.error" }, "retention run failed");
    }
  };
  const sweep = async () => {
    try {
      await sweepAnalyses(getDb());
    } catch (e) {
      log.error({ ...errorFields(e), event: "analysis.sweep_error" }, "analysis sweep failed");
    }
    try {
      await sweepEmails(getDb());
    } catch (e) {
      log.error({ ...errorFields(e), event: "email.sweep_error" }, "e-mail sweep failed");
    }
  };
  // Jobs a previous process left are taken over soon after start, then every 30 s.
  setTimeout(() => void sweep(), 5_000).unref();
  setInterval(() => void sweep(), SWEEP_MS).unref();
  // A minute after start (the server is warm), then hourly; the claim makes it once a day.
  setTimeout(() => void retention(), 60_000).unref();
  setInterval(() => void retention(), RETENTION_CHECK_MS).unref();
  log.info({ event: "background.start" }, "background work started");
}
