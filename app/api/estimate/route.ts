import { z } from "zod";
import { loadCapacityQueue } from "@/lib/analysis/capacity-queue";
import { loadCatalogue } from "@/db/queries/catalogue";
import { getUpload } from "@/db/queries/files";
import { withEstimator } from "@/lib/analysis/estimator";
import { firmFreightZone } from "@/lib/analysis/freight-zone";
import { MAX_MODEL_BYTES } from "@/lib/analysis/run";
import { canUseUpload } from "@/lib/auth/policy";
import { AppError } from "@/lib/errors";
import { defineRoute } from "@/lib/server/define-route";
import { signedFileUrl } from "@/lib/uploads/uploadthing";

export const runtime = "nodejs";

const bodySchema = z.object({
  uploadId: z.string().min(1).max(64),
  options: z
    .object({
      units: z.enum(["mm", "in"]).optional(),
      materialKey: z.string().max(60).optional(),
      allowanceMm: z.number().min(0).max(100).optional(),
      cellKey: z.string().max(60).optional(),
      printMode: z.enum(["shell", "solid"]).optional(),
      shellWalls: z.number().int().min(1).max(20).nullable().optional(),
      orientation: z.enum(["x", "y", "z"]).optional(),
      quantity: z.number().int().min(1).max(50).optional(),
      sealingCoat: z.boolean().optional(),
      vacuumTest: z.boolean().optional(),
      finishBedFace: z.boolean().optional(),
      trimLines: z.boolean().optional(),
      cureTempC: z.number().min(-50).max(450).optional(),
      partCtePpmPerK: z.number().min(-5).max(100).optional(),
      toleranceMm: z.number().positive().max(10).optional(),
    })
    .strict()
    .default({}),
});

/**
 * POST { uploadId, options } → the engine's JSON for that uploaded file. Signed in; the upload
 * must be the caller's own (or their firm's; staff: any). Runs in the worker pool, which also
 * fetches the file; room is held before anything costly, and a busy estimator, a bad file or a
 * failed job answer from the estimator's one table (lib/analysis/estimator.ts).
 */
export const POST = defineRoute({ access: "signed-in", body: bodySchema, headers: { "cache-control": "no-store" } }, async ({ user, db, body }) => {
  const upload = await getUpload(db, body.uploadId);
  if (!upload || !canUseUpload(user, upload)) throw new AppError("not_found:file", "That file was not found.");
  return withEstimator(user, async (run) => {
    const catalogue = await loadCatalogue(db);
    if (!catalogue) throw new AppError("unavailable", "The catalogue is not set up yet.");
    // The worker fetches the file itself by a signed URL (valid while the job may wait its turn)
    // and checks its content, so this thread never holds the model's bytes.
    const url = await signedFileUrl(upload.fileKey, { expiresInS: 600 });
    const freightZone = await firmFreightZone(db, upload.orgId ?? user.orgId, catalogue.rateCard);
    // dates placed around the calendar's booked work, maintenance blocks and accepted orders
    const now = new Date();
    const queue = await loadCapacityQueue(db, now, catalogue.cells.map((c) => c.key));
    return run({ remote: { url, maxBytes: MAX_MODEL_BYTES }, fileName: upload.fileName, options: { ...body.options, freightZone }, catalogue, now, queue: queue.hours, booked: queue.booked });
  });
});
