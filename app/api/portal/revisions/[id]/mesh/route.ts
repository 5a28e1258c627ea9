import { getDb } from "@/db/client";
import { writeAudit } from "@/db/queries/audit";
import { findStoredFile } from "@/db/queries/files";
import { MAX_MODEL_BYTES } from "@/lib/analysis/run";
import { requireUser } from "@/lib/auth/guard";
import { canOpenFiles } from "@/lib/auth/policy";
import { withErrors } from "@/lib/auth/route";
import { AppError } from "@/lib/errors";
import { isEstimateInputError } from "@/lib/estimating/errors";
import { EstimateJobError, getEstimatePool, OwnerBusyError, QueueFullError } from "@/lib/estimating/pool";
import { signedFileUrl } from "@/lib/uploads/uploadthing";

export const runtime = "nodejs";

/** Most triangles sent to the browser; larger meshes are thinned (every k-th triangle) for the preview only. */
const PREVIEW_MAX_TRIANGLES = 400_000;

/**
 * GET /api/portal/revisions/:id/mesh?units=mm|in — the file's triangles in millimetres as raw
 * little-endian float32 (9 per triangle), for the 3D preview. Same rules as a download (firm,
 * controlled clearance) and logged as one. The file is read in the estimator's worker pool;
 * STEP/IGES arrive tessellated by the engine's reader. A preview counts against the user's share
 * of the estimator like an estimate or an analysis: past it, 429 with Retry-After.
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
  let positions: Float32Array;
  let tris: number;
  try {
    // In the estimator's workers, which fetch the file themselves and thin a huge mesh: a large or
    // hostile file must not stall the web thread.
    const bodies = file.selectedBodies ? (JSON.parse(file.selectedBodies) as number[]) : undefined;
    const url = await signedFileUrl(file.fileKey, { expiresInS: 600 });
    const r = await getEstimatePool().read({
      remote: { url, maxBytes: MAX_MODEL_BYTES },
      fileName: file.fileName,
      options: { ...(units === "mm" || units === "in" ? { units } : {}), ...(bodies?.length ? { bodies } : {}), maxTriangles: PREVIEW_MAX_TRIANGLES },
    }, { owner: user.id, lane: file.orgId ?? `staff:${user.id}` });
    positions = r.positions;
    tris = r.triangles;
  } catch (e) {
    if (e instanceof OwnerBusyError) {
      return Response.json({ error: { code: "busy:yours", message: e.message, retryAfterS: e.retryAfterS } }, { status: 429, headers: { "retry-after": String(e.retryAfterS) } });
    }
    if (e instanceof QueueFullError) {
      return Response.json({ error: { code: "busy", message: e.message } }, { status: 503, headers: { "retry-after": String(e.retryAfterS) } });
    }
    if (isEstimateInputError(e)) throw new AppError("invalid_input:file", e.message);
    if (e instanceof EstimateJobError) throw new AppError("unavailable:preview", e.message);
    throw e;
  }
  await writeAudit(db, { actorId: user.id, action: "file.preview", entityType: "revision", entityId: id, orgId: file.orgId, after: { fileName: file.fileName, triangles: tris } });
  return new Response(new Uint8Array(positions.buffer as ArrayBuffer, positions.byteOffset, positions.byteLength), {
    headers: { "content-type": "application/octet-stream", "cache-control": "private, max-age=300", "x-triangles": String(tris) },
  });
});
