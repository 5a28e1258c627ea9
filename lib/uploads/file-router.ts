import { createUploadthing, type FileRouter } from "uploadthing/next";
import { UploadThingError } from "uploadthing/server";
import { getDb } from "@/db/client";
import { recordUpload } from "@/db/queries/files";
import { requireUser } from "@/lib/auth/guard";
import { hasPermission, isStaff } from "@/lib/auth/policy";
import { isAppError } from "@/lib/errors";

const f = createUploadthing();

/** Limits stated in the forms (the service enforces them too). */
export const UPLOAD_LIMITS = {
  model: { maxFileSize: "256MB", label: "256 MB" },
  attachment: { maxFileSize: "32MB", label: "32 MB" },
  inspectionReport: { maxFileSize: "64MB", label: "64 MB" },
} as const;

/** The guard for every slug: signed in, and (optionally) a permission. Errors reach the client as plain text. */
async function guardUpload(check?: (u: Awaited<ReturnType<typeof requireUser>>) => boolean) {
  try {
    const user = await requireUser();
    if (check && !check(user)) throw new UploadThingError({ code: "FORBIDDEN", message: "Your role may not upload this kind of file." });
    return { userId: user.id, orgId: user.orgId };
  } catch (e) {
    if (e instanceof UploadThingError) throw e;
    if (isAppError(e)) throw new UploadThingError({ code: e.status === 401 ? "FORBIDDEN" : "BAD_REQUEST", message: e.message });
    throw e;
  }
}

async function saveUpload(
  purpose: "model" | "attachment" | "inspection_report",
  metadata: { userId: string; orgId: string | null },
  file: { key: string; name: string; size: number; ufsUrl: string; type: string },
) {
  const row = await recordUpload(getDb(), {
    fileKey: file.key,
    fileName: file.name,
    sizeBytes: file.size,
    url: file.ufsUrl,
    contentType: file.type || null,
    userId: metadata.userId,
    orgId: metadata.orgId,
    purpose,
  });
  // Only our own id goes back to the browser; the storage URL stays on the server.
  return { uploadId: row.id };
}

/**
 * The file routes. Models are any bytes here ("blob": mesh and CAD files have no reliable MIME
 * type); their format is checked by content when they are attached to a part.
 */
export const uploadRouter = {
  model: f({ blob: { maxFileSize: UPLOAD_LIMITS.model.maxFileSize, maxFileCount: 1 } })
    .middleware(() => guardUpload((u) => hasPermission(u, "request:create")))
    .onUploadComplete(({ metadata, file }) => saveUpload("model", metadata, file)),

  attachment: f({ blob: { maxFileSize: UPLOAD_LIMITS.attachment.maxFileSize, maxFileCount: 4 } })
    .middleware(() => guardUpload((u) => hasPermission(u, "message:post") || isStaff(u.role)))
    .onUploadComplete(({ metadata, file }) => saveUpload("attachment", metadata, file)),

  inspectionReport: f({ blob: { maxFileSize: UPLOAD_LIMITS.inspectionReport.maxFileSize, maxFileCount: 1 } })
    .middleware(() => guardUpload((u) => hasPermission(u, "production:record")))
    .onUploadComplete(({ metadata, file }) => saveUpload("inspection_report", metadata, file)),
} satisfies FileRouter;

export type UploadRouter = typeof uploadRouter;
