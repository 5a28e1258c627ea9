import { NextResponse } from "next/server";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { analyses, fileRevisions, parts, requests } from "@/db/schema";
import { assertCanSee, requireUser } from "@/lib/auth/guard";
import { isStaff } from "@/lib/auth/policy";
import { withErrors } from "@/lib/auth/route";
import { clientEstimateOf } from "@/lib/estimating/client-view";

/**
 * GET /api/portal/analyses/:id — progress of one analysis, polled by the progress bar; when done,
 * the estimate itself. Scoped to the request's firm.
 */
export const GET = withErrors(async (_req: Request, ctx: { params: Promise<{ id: string }> }) => {
  const user = await requireUser();
  const { id } = await ctx.params;
  const [row] = await getDb()
    .select({ a: analyses, orgId: requests.orgId, createdById: requests.createdById, partId: parts.id })
    .from(analyses)
    .innerJoin(fileRevisions, eq(fileRevisions.id, analyses.revisionId))
    .innerJoin(parts, eq(parts.id, fileRevisions.partId))
    .innerJoin(requests, eq(requests.id, parts.requestId))
    .where(eq(analyses.id, id));
  assertCanSee(user, row ? { orgId: row.orgId, createdById: row.createdById } : null, "analysis");
  const a = row!.a;
  return NextResponse.json(
    {
      id: a.id,
      partId: row!.partId,
      revisionId: a.revisionId,
      status: a.status,
      progress: a.progress,
      stageLabel: a.stageLabel,
      error: a.status === "failed" ? { code: a.errorCode, message: a.errorMessage } : null,
      // a client sees alternatives as cell, total and date, and no price on a needs-review estimate
      result: a.status === "done" ? (isStaff(user.role) ? a.result : clientEstimateOf(a.result)) : null,
    },
    { headers: { "cache-control": "no-store" } },
  );
});
