import { getAnalysisWithScope } from "@/db/queries/analysis-jobs";
import { assertCanSee } from "@/lib/auth/guard";
import { isStaff } from "@/lib/auth/policy";
import { clientEstimateOf } from "@/lib/estimating/client-view";
import { analysisPoll } from "@/lib/contracts/portal";
import { defineRoute } from "@/lib/server/define-route";

/**
 * GET /api/portal/analyses/:id — progress of one analysis, polled by the progress bar; when done,
 * the estimate itself. Scoped to the request's firm.
 */
export const GET = defineRoute<"signed-in", undefined, undefined, { id: string }, typeof analysisPoll>({ access: "signed-in", headers: { "cache-control": "no-store" }, response: analysisPoll }, async ({ user, db, params }) => {
  const row = await getAnalysisWithScope(db, params.id);
  assertCanSee(user, row ? { orgId: row.orgId, createdById: row.createdById } : null, "analysis");
  const a = row!.analysis;
  return {
    id: a.id,
    partId: row!.partId,
    revisionId: a.revisionId,
    status: a.status,
    progress: a.progress,
    stageLabel: a.stageLabel,
    error: a.status === "failed" ? { code: a.errorCode, message: a.errorMessage } : null,
    // a client sees alternatives as cell, total and date, and no price on a needs-review estimate
    result: a.status === "done" ? (isStaff(user.role) ? a.result : clientEstimateOf(a.result)) : null,
  };
});
