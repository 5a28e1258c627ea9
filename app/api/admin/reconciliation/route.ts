import { ledgerForPeriod, listRefundsForPayments } from "@/db/queries/ledger";
import { listNotesFor } from "@/db/queries/reconciliation-notes";
import { AppError } from "@/lib/errors";
import { listProcessorRecords } from "@/lib/payments/stripe";
import { findingKey } from "@/lib/reconciliation/finding-key";
import { fromProcessor } from "@/lib/reconciliation/from-processor";
import { reconcile, summarise } from "@/lib/reconciliation/match";
import { reconciliationAnswer } from "@/lib/contracts/admin";
import { defineRoute } from "@/lib/server/define-route";
import { periodBounds, periodSchema } from "@/lib/validation/admin-accounts";

export const dynamic = "force-dynamic";

/**
 * Our ledger for a period against the processor's charges, payment intents, balance
 * transactions and refunds for the same period: matched, missing either side, amount mismatches.
 */
export const GET = defineRoute({ access: "accounts:ledger", query: periodSchema, response: reconciliationAnswer }, async ({ query: period, db }) => {
  const range = periodBounds(period);
  const ledger = await ledgerForPeriod(db, range.from, range.to);
  const refunds = await listRefundsForPayments(db, ledger.payments.map((p) => p.id));
  let processor;
  try {
    processor = fromProcessor(await listProcessorRecords(range));
  } catch (e) {
    if (e instanceof RangeError) throw new AppError("invalid_input:period", e.message);
    console.error(e);
    throw new AppError("unavailable:processor", "The payment processor did not answer; try again in a moment.");
  }
  // Card payments are matched to the processor's charges here; bank transfers are matched by their
  // arrivals (Bank transfers page) and money recorded by accounts never passed the processor.
  const findings = reconcile({ payments: ledger.payments.filter((p) => p.method === "card"), refunds, ...processor });
  const refs = new Map(ledger.payments.map((p) => [p.id, { reference: p.reference, firmName: p.firmName, paymentKind: p.kind }]));
  const keys = findings.map(findingKey);
  const notes = await listNotesFor(db, [...new Set(keys)]);
  return {
    period,
    summary: summarise(findings),
    findings: findings.map((f, i) => {
      const mine = notes.filter((n) => n.findingKey === keys[i]);
      return {
        ...f,
        ...(f.paymentId ? (refs.get(f.paymentId) ?? {}) : {}),
        findingKey: keys[i]!,
        // The last note decides: a note without "resolved" after a resolution reopens it.
        isResolved: f.kind !== "matched" && Boolean(mine.at(-1)?.isResolved),
        notes: mine.map((n) => ({ note: n.note, isResolved: n.isResolved, at: n.createdAt.toISOString(), author: n.author })),
      };
    }),
  };
});
