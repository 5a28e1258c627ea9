import { NextResponse } from "next/server";
import { getDb } from "@/db/client";
import { getOrderByRequest } from "@/db/queries/payments";
import { getRequest } from "@/db/queries/requests";
import { assertCanSee, requirePermission } from "@/lib/auth/guard";
import { withErrors } from "@/lib/auth/route";

/** GET /api/portal/requests/:id — one request's status (polled after paying). Another firm's → 404. */
export const GET = withErrors(async (_req: Request, ctx: { params: Promise<{ id: string }> }) => {
  const user = await requirePermission("request:read_own");
  const { id } = await ctx.params;
  const db = getDb();
  const r = await getRequest(db, id);
  assertCanSee(user, r ? { orgId: r.orgId, createdById: r.createdById } : null, "request");
  const order = await getOrderByRequest(db, r!.id);
  return NextResponse.json(
    { id: r!.id, reference: r!.reference, projectName: r!.projectName, stage: r!.stage, updatedAt: r!.updatedAt.toISOString(), order: order ? { id: order.id, totalCents: order.totalCents, depositCents: order.depositCents } : null },
    { headers: { "cache-control": "no-store" } },
  );
});
