import { NextResponse } from "next/server";
import { getDb } from "@/db/client";
import { listInbox } from "@/db/queries/quotes";
import { requirePermission } from "@/lib/auth/guard";
import { withErrors } from "@/lib/auth/route";
import { inboxOrder } from "@/lib/quoting/stats";

export const dynamic = "force-dynamic";

/** Submitted requests (and stale quotes), nearest due date first, then oldest. */
export const GET = withErrors(async () => {
  await requirePermission("sales:inbox");
  const rows = inboxOrder(await listInbox(getDb()));
  return NextResponse.json({ rows });
});
