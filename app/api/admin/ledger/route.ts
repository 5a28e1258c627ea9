import { listLedger } from "@/db/queries/ledger";
import { ledgerAnswer } from "@/lib/contracts/admin";
import { defineRoute } from "@/lib/server/define-route";
import { periodBounds, ledgerQuerySchema } from "@/lib/validation/admin-accounts";

export const dynamic = "force-dynamic";

/** Every payment with its order, amount, fee and status: filtered, sorted and paged on the server. */
export const GET = defineRoute({ access: "accounts:ledger", query: ledgerQuerySchema, response: ledgerAnswer }, async ({ query: q, db }) => {
  const bounds = q.from && q.to ? periodBounds({ from: q.from, to: q.to }) : { from: q.from ? new Date(`${q.from}T00:00:00Z`) : undefined, to: q.to ? new Date(`${q.to}T23:59:59.999Z`) : undefined };
  return listLedger(db, { ...q, ...bounds });
});
