import { z } from "zod";
import { writeAudit } from "@/db/queries/audit";
import { findStoredFile } from "@/db/queries/files";
import { readModel } from "@/lib/analysis/estimator";
import { MAX_MODEL_BYTES } from "@/lib/analysis/run";
import { canOpenFiles } from "@/lib/auth/policy";
import { AppError } from "@/lib/errors";
import { defineRoute } from "@/lib/server/define-route";
import { signedFileUrl } from "@/lib/uploads/uploadthing";

export const runtime = "nodejs";

/** Most triangles sent to the browser; larger meshes are thinned (every k-th triangle) for the preview only. */
const PREVIEW_MAX_TRIANGLES = 400_000;

/** `units` is the file's, when the client has said (anything else reads as not said). */
const querySchema = z.object({ units: z.enum(["mm", "in"]).optional().catch(undefined) });

/**
 * GET /api/portal/revisions/:id/mesh?units=mm|in — the file's triangles in millimetres as raw
 * little-endian float32 (9 per triangle), for the 3D preview. Same rules as a download (firm,
 * controlled clearance) and logged as one. The file is read in the estimator's worker pool;
 * STEP/IGES arrive tessellated by the engine's reader. A preview counts against the user's share
 * of the estimator like an estimate or an analysis; a busy estimator, a bad file or a failed read
 * answer from the estimator's one table (lib/analysis/estimator.ts).
 */
export const GET = defineRoute<"signed-in", typeof querySchema, undefined, { id: string }>({ access: "signed-in", query: querySchema }, async ({ user, db, params, query }) => {
  const file = params.id.length <= 64 ? await findStoredFile(db, params.id) : null;
  if (!file || file.kind !== "revision" || !canOpenFiles(user, { orgId: file.orgId, createdById: file.createdById, isControlled: file.isControlled })) {
    throw new AppError("not_found:file", "That file was not found.");
  }
  // In the estimator's workers, which fetch the file themselves and thin a huge mesh: a large or
  // hostile file must not stall the web thread.
  const bodies = file.selectedBodies ? (JSON.parse(file.selectedBodies) as number[]) : undefined;
  const url = await signedFileUrl(file.fileKey, { expiresInS: 600 });
  const { positions, triangles } = await readModel(user, {
    remote: { url, maxBytes: MAX_MODEL_BYTES },
    fileName: file.fileName,
    options: { ...(query.units ? { units: query.units } : {}), ...(bodies?.length ? { bodies } : {}), maxTriangles: PREVIEW_MAX_TRIANGLES },
  });
  await writeAudit(db, { actorId: user.id, action: "file.preview", entityType: "revision", entityId: params.id, orgId: file.orgId, after: { fileName: file.fileName, triangles } });
  return new Response(new Uint8Array(positions.buffer as ArrayBuffer, positions.byteOffset, positions.byteLength), {
    headers: { "content-type": "application/octet-stream", "cache-control": "private, max-age=300", "x-triangles": String(triangles) },
  });
});
