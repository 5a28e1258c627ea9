import { NextResponse } from "next/server";
import { getDb } from "@/db/client";
import { auditFilterOptions, listAudit } from "@/db/queries/audit-read";
import { requirePermission } from "@/lib/auth/guard";
import { withErrors } from "@/lib/auth/route";
import { auditQuerySchema } from "@/lib/validation/admin-staff";

export const dynamic = "force-dynamic";

/** The audit log, filtered by user, entity and date, paged on the server. */
export const GET = withErrors(async (req: Request) => {
  await requirePermission("admin:audit");
  const q = auditQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  const db = getDb();
  const [list, options] = await Promise.all([
    listAudit(db, { ...q, from: q.from ? new Date(`${q.from}T00:00:00Z`) : undefined, to: q.to ? new Date(`${q.to}T23:59:59.999Z`) : undefined }),
    auditFilterOptions(db),
  ]);
  return NextResponse.json({ ...list, options });
});
