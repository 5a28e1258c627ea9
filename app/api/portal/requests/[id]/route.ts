import { getOrderByRequest } from "@/db/queries/payments";
import { getRequest } from "@/db/queries/requests";
import { assertCanSee } from "@/lib/auth/guard";
import { requestStatus } from "@/lib/contracts/portal";
import { defineRoute } from "@/lib/server/define-route";

/** GET /api/portal/requests/:id — one request's status (polled after paying). Another firm's → 404. */
export const GET = defineRoute<"request:read_own", undefined, undefined, { id: string }, typeof requestStatus>({ access: "request:read_own", headers: { "cache-control": "no-store" }, response: requestStatus }, async ({ user, db, params }) => {
  const r = await getRequest(db, params.id);
  assertCanSee(user, r ? { orgId: r.orgId, createdById: r.createdById } : null, "request");
  const order = await getOrderByRequest(db, r!.id);
  return { id: r!.id, reference: r!.reference, projectName: r!.projectName, stage: r!.stage, updatedAt: r!.updatedAt.toISOString(), order: order ? { id: order.id, totalCents: order.totalCents, depositCents: order.depositCents } : null };
});
