import "server-only";
import { getDb, type Db } from "@/db/client";
import { writeAudit } from "@/db/queries/audit";
import { getRevision } from "@/db/queries/files";
import { createPart, deletePartsNotIn, getPart, latestAnalyses, listParts, updatePart } from "@/db/queries/parts";
import { createDraftRequest, updateDraftRequest } from "@/db/queries/request-drafts";
import { getRequest } from "@/db/queries/requests";
import { analysisOptionsFor, sameOptions } from "@/lib/analysis/options";
import { startAnalysis } from "@/lib/analysis/run";
import { assertCanSee, type CurrentUser } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";
import { currentRequestId } from "@/lib/observability/request-id";
import { partToRow, toDraftFields, type DraftValues } from "@/lib/validation/request";

/** A client's request while it is a draft: the edit rule, saving it whole, and re-running what changed. */

/** The request, if this user may edit it as a draft; otherwise the matching AppError. */
export async function editableDraft(user: CurrentUser, requestId: string) {
  const db = getDb();
  const req = await getRequest(db, requestId);
  assertCanSee(user, req ? { orgId: req.orgId, createdById: req.createdById } : null, "request");
  if (req!.stage !== "draft") throw new AppError("conflict:stage", "This request has been submitted; it can no longer be edited.");
  return req!;
}

export interface SavedDraft {
  requestId: string;
  reference: string;
  /** Per part: the analysis now running for it (new or re-run because options changed). */
  analyses: Record<string, string>;
}

/** Save the whole draft (project fields and parts, by their ids); the request is made on the first save. */
export async function persistDraft(v: DraftValues, user: CurrentUser, db: Db): Promise<SavedDraft> {
  if (!user.orgId) throw new AppError("forbidden", "Your account is not part of a client firm.");
  const fields = toDraftFields(v.project);
  let requestId = v.requestId;
  let reference: string;
  if (!requestId) {
    const created = await createDraftRequest(db, {
      orgId: user.orgId,
      createdById: user.id,
      fields,
    });
    requestId = created.id;
    reference = created.reference;
    await writeAudit(db, {
      actorId: user.id,
      action: "request.create",
      entityType: "request",
      entityId: requestId,
      orgId: user.orgId,
    });
  } else {
    const req = await editableDraft(user, requestId);
    reference = req.reference;
    await updateDraftRequest(db, requestId, fields);
  }
  const rid = requestId;

  const existing = await listParts(db, rid);
  const ids = v.parts.map((p) => p.id);
  await db.transaction(async (tx) => {
    for (const [i, p] of v.parts.entries()) {
      const row = { ...partToRow(p), sort: i };
      if (existing.some((e) => e.id === p.id)) {
        await updatePart(tx, rid, p.id, row);
      } else {
        // A client-made id must be new: never take over a part of another request.
        const other = await getPart(tx, p.id);
        if (other) throw new AppError("invalid_input", "A part id was reused; reload the page.");
        await createPart(tx, { id: p.id, requestId: rid, ...row });
      }
    }
    await deletePartsNotIn(tx, rid, ids);
  });

  const analyses = await rerunChangedAnalyses(rid);
  return { requestId: rid, reference, analyses };
}

/** Start a new analysis for every part whose current options differ from its latest analysis. */
export async function rerunChangedAnalyses(requestId: string): Promise<Record<string, string>> {
  const db = getDb();
  const req = await getRequest(db, requestId);
  if (!req) return {};
  const ps = await listParts(db, requestId);
  const withRev = ps.filter((p) => p.currentRevisionId);
  const latest = await latestAnalyses(
    db,
    withRev.map((p) => p.currentRevisionId!),
  );
  const out: Record<string, string> = {};
  for (const p of withRev) {
    const options = analysisOptionsFor(p, req);
    const a = latest.get(p.currentRevisionId!);
    // Confirming the units the engine guessed changes nothing: compare with the guess filled in.
    const guessed = a?.result?.units;
    const before = a
      ? {
          ...(guessed && a.options.units === undefined ? { units: guessed } : {}),
          ...a.options,
        }
      : null;
    if (a && sameOptions(before, options as Record<string, unknown>)) continue;
    const rev = await getRevision(db, p.currentRevisionId!);
    if (!rev) continue;
    const { analysisId } = await startAnalysis(
      db,
      {
        revisionId: rev.id,
        fileKey: rev.fileKey,
        fileName: rev.fileName,
        options,
      },
      { requestId: await currentRequestId() },
    );
    out[p.id] = analysisId;
  }
  return out;
}
