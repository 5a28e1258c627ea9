import type { Db } from "../../db/client";
import { claimTermsNotice, listTermsInvoices } from "../../db/queries/account-terms";
import { writeAudit } from "../../db/queries/audit";
import { invoiceStanding } from "./terms";

export interface DunningSummary {
  reminders: string[];
  overdue: string[];
}

/**
 * Invoices on net terms: a reminder once an unpaid invoice is due soon, an overdue notice once it
 * is past due (each once per invoice, claimed by a conditional update, so several processes may
 * run it). The overdue notice is audited for accounts. `send` queues the e-mail (the durable outbox).
 */
export async function runTermsNotices(db: Db, now: Date, send: (orderId: string, which: "reminder" | "overdue") => Promise<void>): Promise<DunningSummary> {
  const out: DunningSummary = { reminders: [], overdue: [] };
  for (const inv of await listTermsInvoices(db)) {
    const standing = invoiceStanding({ dueAt: inv.dueAt, isPaid: inv.isPaid || inv.owedCents === 0, now });
    if (standing === "due_soon" && !inv.reminderSentAt && (await claimTermsNotice(db, inv.orderId, "reminder", now))) {
      await send(inv.orderId, "reminder");
      out.reminders.push(inv.orderId);
    }
    if (standing === "overdue" && !inv.overdueNoticeAt && (await claimTermsNotice(db, inv.orderId, "overdue", now))) {
      await writeAudit(db, { actorId: null, action: "invoice.overdue", entityType: "order", entityId: inv.orderId, orgId: inv.orgId, after: { dueAt: inv.dueAt?.toISOString() ?? null, owedCents: inv.owedCents, invoiceNumber: inv.invoiceNumber } });
      await send(inv.orderId, "overdue");
      out.overdue.push(inv.orderId);
    }
  }
  return out;
}
