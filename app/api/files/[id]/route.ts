import { writeAudit } from "@/db/queries/audit";
import { findStoredFile } from "@/db/queries/files";
import { getFileRetention } from "@/db/queries/retention";
import { clientAddress } from "@/lib/auth/client-address";
import { canOpenStoredFile } from "@/lib/auth/policy";
import { AppError } from "@/lib/errors";
import { defineRoute } from "@/lib/server/define-route";
import { openUploadedFile } from "@/lib/uploads/uploadthing";

export const runtime = "nodejs";

const safeName = (name: string) => name.replace(/[^\w.\- ]+/g, "_").slice(0, 120) || "file";

/**
 * GET /api/files/:id — the only way a browser gets a stored file's bytes. Another firm's file,
 * or a controlled file to someone not cleared, answers 404 (its existence stays hidden). Every
 * download, and every refused one, is written to the audit log.
 */
export const GET = defineRoute<"signed-in", undefined, undefined, { id: string }>({ access: "signed-in" }, async ({ req, user, db, params: { id } }) => {
  const file = id.length <= 64 ? await findStoredFile(db, id) : null;
  const ip = clientAddress(req.headers);
  if (!file || !canOpenStoredFile(user, file)) {
    await writeAudit(db, { actorId: user.id, action: "file.download_refused", entityType: "file", entityId: id.slice(0, 64), orgId: file?.orgId ?? null, ip });
    throw new AppError("not_found:file", "That file was not found.");
  }
  if (file.kind === "revision" && file.requestId && (await getFileRetention(db, file.requestId))?.filesDeletedAt) {
    throw new AppError("gone:file", "This model file was deleted under the bureau's retention rule; the order's record and documents remain.");
  }
  // Streamed from storage to the browser: the server holds a chunk at a time, never the whole file.
  const stored = await openUploadedFile(file.fileKey);
  await writeAudit(db, {
    actorId: user.id,
    action: "file.download",
    entityType: file.kind,
    entityId: id,
    orgId: file.orgId,
    after: { fileName: file.fileName, sizeBytes: stored.sizeBytes, requestId: file.requestId, isControlled: file.isControlled },
    ip,
  });
  const inline = new URL(req.url).searchParams.get("inline") === "1" && /^(application\/pdf|image\/(png|jpeg))$/.test(file.contentType ?? "");
  const name = safeName(file.fileName);
  return new Response(stored.body, {
    headers: {
      "content-type": inline ? file.contentType! : "application/octet-stream",
      ...(stored.sizeBytes !== null ? { "content-length": String(stored.sizeBytes) } : {}),
      // RFC 6266: a plain ASCII name for every browser, and the UTF-8 name (RFC 8187) for those that read it.
      "content-disposition": `${inline ? "inline" : "attachment"}; filename="${name}"; filename*=UTF-8''${encodeURIComponent(file.fileName.slice(0, 120))}`,
      "cache-control": "private, no-store",
      "x-content-type-options": "nosniff",
    },
  });
});
