"use server";

import { and, eq, notInArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import { parts } from "@/db/schema";
import { writeAudit } from "@/db/queries/audit";
import { markQuotesStale } from "@/db/queries/client-quotes";
import { addFileRevision, getRevision, getUploadOwned } from "@/db/queries/files";
import { createPart, getPart, latestAnalyses, listParts, updatePart } from "@/db/queries/parts";
import { createDraftRequest, getRequest, updateDraftRequest } from "@/db/queries/requests";
import { transitionStage } from "@/db/queries/stages";
import { analysisOptionsFor, sameOptions } from "@/lib/analysis/options";
import { MAX_MODEL_BYTES, startAnalysis } from "@/lib/analysis/run";
import { currentRequestId } from "@/lib/observability/request-id";
import { exportHint } from "@/lib/analysis/export-hints";
import { checkModelUpload, SNIFF_HEAD_BYTES } from "@/lib/analysis/sniff";
import { requirePermission, assertCanSee, type CurrentUser } from "@/lib/auth/guard";
import { notifyRequestReceived } from "@/lib/email/notify";
import { AppError, toActionError, type ActionResult } from "@/lib/errors";
import { readUploadedFileHead } from "@/lib/uploads/uploadthing";
import { draftSchema, partToRow, submitSchema, toDraftFields, type DraftInput } from "@/lib/validation/request";
import type { z } from "zod";

function fieldErrorsOf(error: z.ZodError): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const i of error.issues) (out[i.path.join(".")] ??= []).push(i.message);
  return out;
}

/** The request, if this user may edit it as a draft; otherwise the matching AppError. */
async function editableDraft(user: CurrentUser, requestId: string) {
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

/**
 * Save the whole draft (project fields and parts, by their ids). Creates the request on the first
 * save. A part whose options changed gets its analysis re-run.
 */
export async function saveDraft(input: DraftInput): Promise<ActionResult<SavedDraft>> {
  const parsed = draftSchema.safeParse(input);
  if (!parsed.success) return { ok: false, code: "invalid_input", message: "Some fields need attention; the draft was not saved.", fieldErrors: fieldErrorsOf(parsed.error) };
  try {
    const user = await requirePermission("request:edit_draft");
    if (!user.orgId) throw new AppError("forbidden", "Your account is not part of a client firm.");
    const db = getDb();
    const v = parsed.data;
    const fields = toDraftFields(v.project);
    let requestId = v.requestId;
    let reference: string;
    if (!requestId) {
      const created = await createDraftRequest(db, { orgId: user.orgId, createdById: user.id, fields });
      requestId = created.id;
      reference = created.reference;
      await writeAudit(db, { actorId: user.id, action: "request.create", entityType: "request", entityId: requestId, orgId: user.orgId });
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
      await tx.delete(parts).where(and(eq(parts.requestId, rid), ids.length ? notInArray(parts.id, ids) : undefined));
    });

    const analyses = await rerunChangedAnalyses(rid);
    return { ok: true, data: { requestId: rid, reference, analyses } };
  } catch (e) {
    return toActionError(e);
  }
}

/** Start a new analysis for every part whose current options differ from its latest analysis. */
async function rerunChangedAnalyses(requestId: string): Promise<Record<string, string>> {
  const db = getDb();
  const req = await getRequest(db, requestId);
  if (!req) return {};
  const ps = await listParts(db, requestId);
  const withRev = ps.filter((p) => p.currentRevisionId);
  const latest = await latestAnalyses(db, withRev.map((p) => p.currentRevisionId!));
  const out: Record<string, string> = {};
  for (const p of withRev) {
    const options = analysisOptionsFor(p, req);
    const a = latest.get(p.currentRevisionId!);
    // Confirming the units the engine guessed changes nothing: compare with the guess filled in.
    const guessed = a?.result?.units;
    const before = a ? { ...(guessed && a.options.units === undefined ? { units: guessed } : {}), ...a.options } : null;
    if (a && sameOptions(before, options as Record<string, unknown>)) continue;
    const rev = await getRevision(db, p.currentRevisionId!);
    if (!rev) continue;
    const { analysisId } = await startAnalysis(db, { revisionId: rev.id, fileKey: rev.fileKey, fileName: rev.fileName, options }, { requestId: await currentRequestId() });
    out[p.id] = analysisId;
  }
  return out;
}

export interface AttachedFile {
  revisionId: string;
  revision: number;
  analysisId: string;
  fileName: string;
}

/**
 * Attach an uploaded file to a part of a draft: check its content, add a file revision, mark any
 * quote stale and start the analysis. A bad file gets a message for that part; nothing else changes.
 */
/** Stages in which a client may still send a new revision of a part's file (before acceptance). */
const REVISABLE = new Set(["draft", "submitted", "quoted"]);

export async function attachPartFile(input: { requestId: string; partId: string; uploadId: string }): Promise<ActionResult<AttachedFile>> {
  try {
    if (!input || typeof input !== "object") throw new AppError("invalid_input", "The request was not valid.");
    const user = await requirePermission("request:edit_draft");
    const db0 = getDb();
    const found = await getRequest(db0, String(input.requestId));
    assertCanSee(user, found ? { orgId: found.orgId, createdById: found.createdById } : null, "request");
    if (!REVISABLE.has(found!.stage)) throw new AppError("conflict:stage", "The quote is accepted; send changed files to the bureau in a message so they can re-plan.");
    const req = found!;
    const db = getDb();
    const part = await getPart(db, String(input.partId));
    if (!part || part.requestId !== req.id) throw new AppError("not_found:part", "That part was not found; save the draft and try again.");
    const upload = await getUploadOwned(db, String(input.uploadId), user.id);
    if (!upload || upload.purpose !== "model") throw new AppError("not_found:file", "That upload was not found; upload the file again.");
    // Only the file's first bytes are read here, to check its format; the analysis worker reads,
    // checks and hashes the whole file off the request thread.
    const { head, sizeBytes: storedBytes } = await readUploadedFileHead(upload.fileKey, SNIFF_HEAD_BYTES).catch((e: Error) => {
      throw new AppError("unavailable", `The file could not be read back from storage (${e.message}). Upload it again.`);
    });
    const sizeBytes = storedBytes ?? upload.sizeBytes;
    if (sizeBytes > MAX_MODEL_BYTES) throw new AppError("invalid_input:file", `“${upload.fileName}” is larger than ${MAX_MODEL_BYTES / 1024 / 1024} MB.`);
    const check = checkModelUpload(head, upload.fileName, sizeBytes);
    if (!check.ok) {
      // Kept on the part, so the message and its export hint survive a reload.
      const message = `${check.message} ${exportHint(upload.fileName)}`;
      await updatePart(db, req.id, part.id, { fileProblem: message });
      throw new AppError("invalid_input:file", message);
    }
    const rev = await db.transaction(async (tx) => {
      const r = await addFileRevision(tx, {
        partId: part.id,
        uploadId: upload.id,
        fileKey: upload.fileKey,
        fileName: upload.fileName,
        sizeBytes,
        sha256: null,
        format: check.format,
        uploadedById: user.id,
      });
      // A new file needs a fresh guess at its units (a submitted request keeps the confirmed ones).
      if (req.stage === "draft") await updatePart(tx, req.id, part.id, { unitsConfirmed: false });
      // Body choices point into the old file's bodies.
      await updatePart(tx, req.id, part.id, { selectedBodies: null, fileProblem: null });
      await markQuotesStale(tx, req.id);
      return r;
    });
    if (req.stage !== "draft") {
      await writeAudit(db, { actorId: user.id, action: "part.revision", entityType: "part", entityId: part.id, orgId: req.orgId, after: { revision: rev.revision, fileName: upload.fileName } });
    }
    const fresh = (await getPart(db, part.id))!;
    const { analysisId } = await startAnalysis(
      db,
      { revisionId: rev.id, fileKey: upload.fileKey, fileName: upload.fileName, options: analysisOptionsFor(fresh, req) },
      { requestId: await currentRequestId() },
    );
    return { ok: true, data: { revisionId: rev.id, revision: rev.revision, analysisId, fileName: upload.fileName } };
  } catch (e) {
    return toActionError(e);
  }
}

/** Submit a draft: every part has a file whose analysis finished and confirmed units. */
export async function submitRequest(input: DraftInput): Promise<ActionResult<{ requestId: string }>> {
  const parsed = submitSchema.safeParse(input);
  if (!parsed.success) return { ok: false, code: "invalid_input", message: "Some fields need attention before you can submit.", fieldErrors: fieldErrorsOf(parsed.error) };
  const saved = await saveDraft(input);
  if (!saved.ok) return saved;
  try {
    const user = await requirePermission("request:create");
    const db = getDb();
    const requestId = saved.data.requestId;
    await editableDraft(user, requestId);
    const ps = await listParts(db, requestId);
    const latest = await latestAnalyses(db, ps.map((p) => p.currentRevisionId).filter((x): x is string => Boolean(x)));
    const problems: Record<string, string[]> = {};
    ps.forEach((p, i) => {
      const a = p.currentRevisionId ? latest.get(p.currentRevisionId) : undefined;
      if (!p.currentRevisionId) problems[`parts.${i}.file`] = ["Upload a file for this part."];
      else if (!a || a.status === "queued" || a.status === "running") problems[`parts.${i}.file`] = ["Wait for the analysis to finish."];
      else if (a.status === "failed") problems[`parts.${i}.file`] = ["This file could not be analysed; upload a corrected file."];
    });
    if (Object.keys(problems).length) return { ok: false, code: "invalid_input", message: "Some parts are not ready yet.", fieldErrors: problems };
    await transitionStage(db, { requestId, to: "submitted", actorId: user.id, note: "Submitted by the client", expectedFrom: "draft" });
    await notifyRequestReceived(requestId).catch((e: unknown) => console.error("request-received e-mail failed", e));
    return { ok: true, data: { requestId } };
  } catch (e) {
    return toActionError(e);
  }
}
