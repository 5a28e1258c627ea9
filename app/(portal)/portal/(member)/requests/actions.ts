"use server";

import { writeAudit } from "@/db/queries/audit";
import { markQuotesStale } from "@/db/queries/client-quotes";
import { addFileRevision, getUploadOwned } from "@/db/queries/files";
import { getPart, latestAnalyses, listParts, updatePart } from "@/db/queries/parts";
import { getRequest } from "@/db/queries/requests";
import { transitionStage } from "@/lib/orders/transition";
import { analysisOptionsFor } from "@/lib/analysis/options";
import { MAX_MODEL_BYTES, startAnalysis } from "@/lib/analysis/run";
import { currentRequestId } from "@/lib/observability/request-id";
import { exportHint } from "@/lib/analysis/export-hints";
import { checkModelUpload, SNIFF_HEAD_BYTES } from "@/lib/analysis/sniff";
import { assertCanSee } from "@/lib/auth/guard";
import { hasPermission } from "@/lib/auth/policy";
import { notifyRequestReceived } from "@/lib/email/notify";
import { AppError } from "@/lib/errors";
import { rootLogger } from "@/lib/observability/log";
import { defineAction } from "@/lib/server/define-action";
import { readUploadedFileHead } from "@/lib/uploads/uploadthing";
import { z } from "zod";
import { editableDraft, persistDraft } from "@/lib/requests/draft";
import { draftSchema, submitSchema } from "@/lib/validation/request";

/**
 * Save the whole draft (project fields and parts, by their ids). Creates the request on the first
 * save. A part whose options changed gets its analysis re-run.
 */
export const saveDraft = defineAction(
  {
    access: "request:edit_draft",
    input: draftSchema,
    invalid: "Some fields need attention; the draft was not saved.",
  },
  async (v, { user, db }) => persistDraft(v, user, db),
);

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

const attachSchema = z.object({
  requestId: z.string().min(1).max(64),
  partId: z.string().min(1).max(64),
  uploadId: z.string().min(1).max(64),
});

export const attachPartFile = defineAction(
  {
    access: "request:edit_draft",
    input: attachSchema,
    invalid: "The request was not valid.",
  },
  async (input, { user, db }): Promise<AttachedFile> => {
    const found = await getRequest(db, input.requestId);
    assertCanSee(user, found ? { orgId: found.orgId, createdById: found.createdById } : null, "request");
    if (!REVISABLE.has(found!.stage)) throw new AppError("conflict:stage", "The quote is accepted; send changed files to the bureau in a message so they can re-plan.");
    const req = found!;
    const part = await getPart(db, input.partId);
    if (!part || part.requestId !== req.id) throw new AppError("not_found:part", "That part was not found; save the draft and try again.");
    const upload = await getUploadOwned(db, input.uploadId, user.id);
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
      await updatePart(tx, req.id, part.id, {
        selectedBodies: null,
        fileProblem: null,
      });
      await markQuotesStale(tx, req.id);
      return r;
    });
    if (req.stage !== "draft") {
      await writeAudit(db, {
        actorId: user.id,
        action: "part.revision",
        entityType: "part",
        entityId: part.id,
        orgId: req.orgId,
        after: { revision: rev.revision, fileName: upload.fileName },
      });
    }
    const fresh = (await getPart(db, part.id))!;
    const { analysisId } = await startAnalysis(
      db,
      {
        revisionId: rev.id,
        fileKey: upload.fileKey,
        fileName: upload.fileName,
        options: analysisOptionsFor(fresh, req),
      },
      { requestId: await currentRequestId() },
    );
    return {
      revisionId: rev.id,
      revision: rev.revision,
      analysisId,
      fileName: upload.fileName,
    };
  },
);

/** Submit a draft: every part has a file whose analysis finished and confirmed units. */
export const submitRequest = defineAction(
  {
    access: "request:create",
    input: submitSchema,
    invalid: "Some fields need attention before you can submit.",
  },
  async (v, { user, db }) => {
    // Saved first, as the draft's own save would: submitting needs the right to edit the draft too.
    if (!hasPermission(user, "request:edit_draft")) throw new AppError("forbidden", "Your role does not give access to this.");
    const saved = await persistDraft(v, user, db);
    const requestId = saved.requestId;
    await editableDraft(user, requestId);
    const ps = await listParts(db, requestId);
    const latest = await latestAnalyses(
      db,
      ps.map((p) => p.currentRevisionId).filter((x): x is string => Boolean(x)),
    );
    const problems: Record<string, string[]> = {};
    ps.forEach((p, i) => {
      const a = p.currentRevisionId ? latest.get(p.currentRevisionId) : undefined;
      if (!p.currentRevisionId) problems[`parts.${i}.file`] = ["Upload a file for this part."];
      else if (!a || a.status === "queued" || a.status === "running") problems[`parts.${i}.file`] = ["Wait for the analysis to finish."];
      else if (a.status === "failed") problems[`parts.${i}.file`] = ["This file could not be analysed; upload a corrected file."];
    });
    if (Object.keys(problems).length) throw new AppError("invalid_input", "Some parts are not ready yet.", problems);
    await transitionStage(db, {
      requestId,
      to: "submitted",
      actorId: user.id,
      note: "Submitted by the client",
      expectedFrom: "draft",
    });
    await notifyRequestReceived(requestId).catch((e: unknown) => rootLogger().error({ event: "request.received_mail_failed", err: String(e) }, "request-received e-mail failed"));
    return { requestId };
  },
);
