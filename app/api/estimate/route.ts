import { NextResponse } from "next/server";
import { z } from "zod";
import { getDb } from "@/db/client";
import { loadCatalogue } from "@/db/queries/catalogue";
import { getUpload } from "@/db/queries/files";
import { MAX_MODEL_BYTES } from "@/lib/analysis/run";
import { checkModelUpload } from "@/lib/analysis/sniff";
import { requireUser } from "@/lib/auth/guard";
import { withErrors } from "@/lib/auth/route";
import { canSee, isStaff } from "@/lib/auth/policy";
import { AppError } from "@/lib/errors";
import { isEstimateInputError } from "@/lib/estimating/errors";
import { EstimateJobError, getEstimatePool, QueueFullError } from "@/lib/estimating/pool";
import { fetchUploadedFile } from "@/lib/uploads/uploadthing";

export const runtime = "nodejs";

const bodySchema = z.object({
  uploadId: z.string().min(1).max(64),
  options: z
    .object({
      units: z.enum(["mm", "in"]).optional(),
      materialKey: z.string().max(60).optional(),
      allowanceMm: z.number().min(0).max(100).optional(),
      cellKey: z.string().max(60).optional(),
      shellWalls: z.number().int().min(1).max(20).nullable().optional(),
      orientation: z.enum(["x", "y", "z"]).optional(),
      quantity: z.number().int().min(1).max(50).optional(),
      sealingCoat: z.boolean().optional(),
      vacuumTest: z.boolean().optional(),
      cureTempC: z.number().min(-50).max(450).optional(),
      partCtePpmPerK: z.number().min(-5).max(100).optional(),
      toleranceMm: z.number().positive().max(10).optional(),
    })
    .strict()
    .default({}),
});

/**
 * POST { uploadId, options } → the engine's JSON for that uploaded file. Signed in; the upload
 * must be the caller's own (or their firm's; staff: any). Runs in the worker pool; a full queue
 * answers 503 with Retry-After.
 */
export const POST = withErrors(async (req: Request) => {
  const user = await requireUser();
  const body = bodySchema.parse(await req.json().catch(() => {
    throw new AppError("invalid_input", "Send a JSON body: { uploadId, options }.");
  }));
  const db = getDb();
  const upload = await getUpload(db, body.uploadId);
  const visible =
    upload &&
    (upload.userId === user.id || isStaff(user.role) || (upload.orgId !== null && canSee(user, { orgId: upload.orgId, createdById: user.role === "client" ? upload.userId : undefined })));
  if (!upload || !visible) throw new AppError("not_found:file", "That file was not found.");

  // Refuse at once when the estimator is saturated, before fetching and checking the file.
  const pool = getEstimatePool();
  if (pool.isFull) {
    return NextResponse.json({ error: { code: "busy", message: new QueueFullError(pool.retryAfterS).message } }, { status: 503, headers: { "retry-after": String(pool.retryAfterS) } });
  }
  const bytes = await fetchUploadedFile(upload.fileKey, { maxBytes: MAX_MODEL_BYTES });
  const check = checkModelUpload(bytes, upload.fileName);
  if (!check.ok) return NextResponse.json({ error: { code: "file:type", message: check.message } }, { status: 422 });
  const catalogue = await loadCatalogue(db);
  if (!catalogue) throw new AppError("unavailable", "The catalogue is not set up yet.");

  try {
    const result = await pool.run({ bytes, fileName: upload.fileName, options: body.options, catalogue, now: new Date() });
    return NextResponse.json(result, { headers: { "cache-control": "no-store" } });
  } catch (e) {
    if (e instanceof QueueFullError) {
      return NextResponse.json({ error: { code: "busy", message: e.message } }, { status: 503, headers: { "retry-after": String(e.retryAfterS) } });
    }
    if (isEstimateInputError(e)) return NextResponse.json({ error: { code: e.code, message: e.message } }, { status: 422 });
    if (e instanceof EstimateJobError) return NextResponse.json({ error: { code: `job:${e.code}`, message: e.message } }, { status: e.code === "timeout" ? 504 : 500 });
    throw e;
  }
});
