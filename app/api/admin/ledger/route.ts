import { NextResponse } from "next/server";
import { getDb } from "@/db/client";
import { listLedger } from "@/db/queries/ledger";
import { requirePermission } from "@/lib/auth/guard";
import { withErrors } from "@/lib/auth/route";
import { periodBounds, ledgerQuerySchema } from "@/lib/validation/admin-accounts";

export const dynamic = "force-dynamic";

/** Every payment with its order, amount, fee and status: filtered, sorted and paged on the server. */
export const GET = withErrors(async (req: Request) => {
  await requirePermission("accounts:ledger");
  const q = ledgerQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  const bounds = q.from && q.to ? periodBounds({ from: q.from, to: q.to }) : { from: q.from ? new Date(`${q.from}T00:00:00Z`) : undefined, to: q.to ? new Date(`${q.to}T23:59:59.999Z`) : undefined };
  return NextResponse.json(await listLedger(getDb(), { ...q, ...bounds }));
});
