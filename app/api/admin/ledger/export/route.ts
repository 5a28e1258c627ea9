import { getDb } from "@/db/client";
import { writeAudit } from "@/db/queries/audit";
import { ledgerForPeriod } from "@/db/queries/ledger";
import { requirePermission } from "@/lib/auth/guard";
import { withErrors } from "@/lib/auth/route";
import { ledgerCsv } from "@/lib/reconciliation/csv";
import { periodBounds, periodSchema } from "@/lib/validation/admin-accounts";

export const dynamic = "force-dynamic";

/** The ledger of a date range as CSV (payments and refunds); the export itself is audited. */
export const GET = withErrors(async (req: Request) => {
  const user = await requirePermission("accounts:ledger");
  const period = periodSchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  const { from, to } = periodBounds(period);
  const db = getDb();
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
