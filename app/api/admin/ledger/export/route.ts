import { writeAudit } from "@/db/queries/audit";
import { ledgerForPeriod } from "@/db/queries/ledger";
import { ledgerCsv } from "@/lib/reconciliation/csv";
import { defineRoute } from "@/lib/server/define-route";
import { periodBounds, periodSchema } from "@/lib/validation/admin-accounts";

export const dynamic = "force-dynamic";

/** The ledger of a date range as CSV (payments and refunds); the export itself is audited. */
export const GET = defineRoute({ access: "accounts:ledger", query: periodSchema }, async ({ query: period, user, db }) => {
  const { from, to } = periodBounds(period);
  const data = await ledgerForPeriod(db, from, to);
  await writeAudit(db, { actorId: user.id, action: "ledger.export", entityType: "ledger", after: { ...period, payments: data.payments.length, refunds: data.refunds.length } });
  return new Response(ledgerCsv(data.payments, data.refunds), {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="ledger-${period.from}-to-${period.to}.csv"`,
      "cache-control": "no-store",
    },
  });
});
