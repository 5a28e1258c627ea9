import { getDb } from "@/db/client";
import { writeAudit } from "@/db/queries/audit";
import { findStoredFile } from "@/db/queries/files";
import { MAX_MODEL_BYTES } from "@/lib/analysis/run";
import { requireUser } from "@/lib/auth/guard";
import { canOpenFiles } from "@/lib/auth/policy";
import { withErrors } from "@/lib/auth/route";
import { AppError } from "@/lib/errors";
import { isEstimateInputError } from "@/lib/estimating/errors";
import { EstimateJobError, getEstimatePool, QueueFullError } from "@/lib/estimating/pool";
import { fetchUploadedFile } from "@/lib/uploads/uploadthing";

export const runtime = "nodejs";

/** Most triangles sent to the browser; larger meshes are thinned (every k-th triangle) for the preview only. */
const PREVIEW_MAX_TRIANGLES = 400_000;

/**
 * GET /api/portal/revisions/:id/mesh?units=mm|in — the file's triangles in millimetres as raw
 * little-endian float32 (9 per triangle), for the 3D preview. Same rules as a download (firm,
 * controlled clearance) and logged as one. The file is read in the estimator's worker pool;
 * STEP/IGES arrive tessellated by the engine's reader.
 */
export const GET = withErrors(async (req: Request, ctx: { params: Promise<{ id: string }> }) => {
  const user = await requireUser();
  const { id } = await ctx.params;
  const db = getDb();
  const file = await findStoredFile(db, id);
  if (!file || file.kind !== "revision" || !canOpenFiles(user, { orgId: file.orgId, createdById: file.createdById, isControlled: file.isControlled })) {
    throw new AppError("not_found:file", "That file was not found.");
  }
  const units = new URL(req.url).searchParams.get("units");
  const bytes = await fetchUploadedFile(file.fileKey, { maxBytes: MAX_MODEL_BYTES });
  let positions: Float32Array;
  try {
    // In the estimator's workers: a large or hostile STEP file must not stall the web thread.
    const bodies = file.selectedBodies ? (JSON.parse(file.selectedBodies) as number[]) : undefined;
    const r = await getEstimatePool().read({ bytes, fileName: file.fileName, options: { ...(units === "mm" || units === "in" ? { units } : {}), ...(bodies?.length ? { bodies } : {}) } });
    positions = r.positions;
  } catch (e) {
    if (e instanceof QueueFullError) {
      return Response.json({ error: { code: "busy", message: e.message } }, { status: 503, headers: { "retry-after": String(e.retryAfterS) } });
    }
    if (isEstimateInputError(e)) throw new AppError("invalid_input:file", e.message);
    if (e instanceof EstimateJobError) throw new AppError("unavailable:preview", e.message);
    throw e;
  }
  const tris = positions.length / 9;
  if (tris > PREVIEW_MAX_TRIANGLES) {
    const k = Math.ceil(tris / PREVIEW_MAX_TRIANGLES);
    const out = new Float32Array(Math.floor(tris / k) * 9);
    for (let t = 0, o = 0; o < out.length; t += k, o += 9) out.set(positions.subarray(t * 9, t * 9 + 9), o);
    positions = out;
  }
  await writeAudit(db, { actorId: user.id, action: "file.preview", entityType: "revision", entityId: id, orgId: file.orgId, after: { fileName: file.fileName, triangles: tris } });
  return new Response(new Uint8Array(positions.buffer as ArrayBuffer, positions.byteOffset, positions.byteLength), {
    headers: { "content-type": "application/octet-stream", "cache-control": "private, max-age=300", "x-triangles": String(tris) },
  });
});
