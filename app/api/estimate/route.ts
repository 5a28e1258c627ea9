import { firmFreightZone } from "@/lib/analysis/freight-zone";
import { NextResponse } from "next/server";
import { z } from "zod";
import { getDb } from "@/db/client";
import { loadCatalogue } from "@/db/queries/catalogue";
import { getUpload } from "@/db/queries/files";
import { MAX_MODEL_BYTES } from "@/lib/analysis/run";
import { requireUser } from "@/lib/auth/guard";
import { withErrors } from "@/lib/auth/route";
import { canSee, isStaff } from "@/lib/auth/policy";
import { AppError } from "@/lib/errors";
import { isEstimateInputError } from "@/lib/estimating/errors";
import { EstimateJobError, getEstimatePool, QueueFullError } from "@/lib/estimating/pool";
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
 * fetches the file; a full queue answers 503 and a user's third job in flight 429, both with
 * Retry-After.
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

  // Hold room in the estimator before any costly step, or refuse at once: 503 when it is busy,
  // 429 when this user already has their share of jobs in flight.
  // Firms are served in turn, and one firm may hold only its share of the room (lib/estimating/fair-queue.ts).
  const pool = getEstimatePool();
  const ticket = pool.tryReserve(user.id, user.orgId ?? `staff:${user.id}`);
  if ("reason" in ticket) {
    const status = ticket.reason === "owner" ? 429 : 503;
    const wait = `${ticket.queued} estimate${ticket.queued === 1 ? "" : "s"} in line; try again in about ${ticket.retryAfterS} s`;
    const message =
      ticket.reason === "owner"
        ? "You already have estimates running; wait for one to finish."
        : ticket.reason === "lane"
          ? `Your firm's estimates already fill its share of the estimator (${wait}).`
          : `${new QueueFullError(ticket.retryAfterS).message} (${wait}.)`;
    const code = ticket.reason === "owner" ? "busy:yours" : ticket.reason === "lane" ? "busy:firm" : "busy";
    return NextResponse.json({ error: { code, message, queued: ticket.queued, retryAfterS: ticket.retryAfterS } }, { status, headers: { "retry-after": String(ticket.retryAfterS) } });
  }
  try {
    const catalogue = await loadCatalogue(db);
    if (!catalogue) throw new AppError("unavailable", "The catalogue is not set up yet.");
    // The worker fetches the file itself by a signed URL (valid while the job may wait its turn)
    // and checks its content, so this thread never holds the model's bytes.
    const url = await signedFileUrl(upload.fileKey, { expiresInS: 600 });
    const result = await ticket.run({ remote: { url, maxBytes: MAX_MODEL_BYTES }, fileName: upload.fileName, options: { ...body.options, freightZone: await firmFreightZone(db, upload.orgId ?? user.orgId, catalogue.rateCard) }, catalogue, now: new Date() });
    return NextResponse.json(result, { headers: { "cache-control": "no-store" } });
  } catch (e) {
    // (A reservation's run is never refused for room, so no QueueFullError can arrive here.)
    if (isEstimateInputError(e)) return NextResponse.json({ error: { code: e.code, message: e.message } }, { status: 422 });
    if (e instanceof EstimateJobError) {
      const status = e.code === "timeout" ? 504 : e.code === "storage" ? 502 : 500;
      return NextResponse.json({ error: { code: `job:${e.code}`, message: e.message } }, { status });
    }
    throw e;
  } finally {
    ticket.release();
  }
});
