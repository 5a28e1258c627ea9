import { NextResponse } from "next/server";
import { getDb } from "@/db/client";
import { listRequestsForScope } from "@/db/queries/requests";
import { STAGES, type Stage } from "@/db/schema/common";
import { requirePermission } from "@/lib/auth/guard";
import { withErrors } from "@/lib/auth/route";
import { AppError } from "@/lib/errors";
import { listQuerySchema } from "@/lib/validation/request";

/** GET /api/portal/requests?q=&stage=a,b&sort=&dir= — the firm's (client_admin) or own (client) requests. */
export const GET = withErrors(async (req: Request) => {
  const user = await requirePermission("request:read_own");
  if (!user.orgId) throw new AppError("forbidden", "Your account is not part of a client firm.");
  const q = listQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  const stages = (q.stage ?? "").split(",").filter((s): s is Stage => (STAGES as readonly string[]).includes(s));
  const scope = user.role === "client_admin" ? { orgId: user.orgId } : { orgId: user.orgId, createdById: user.id };
  const { rows, total } = await listRequestsForScope(getDb(), scope, { search: q.q, stages, sort: q.sort, dir: q.dir, limit: q.limit, offset: q.offset });
  return NextResponse.json(
    {
      total,
      rows: rows.map((r) => ({
        id: r.id,
        reference: r.reference,
        projectName: r.projectName,
        stage: r.stage,
        neededBy: r.neededBy?.toISOString() ?? null,
        updatedAt: r.updatedAt.toISOString(),
        isControlled: r.isControlled,
        createdByName: r.createdByName,
        partCount: Number(r.partCount),
        totalCents: r.totalCents === null ? null : Number(r.totalCents),
        hasOrder: Boolean(r.orderId),
      })),
    },
    { headers: { "cache-control": "no-store" } },
  );
});
