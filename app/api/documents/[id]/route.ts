import { writeAudit } from "@/db/queries/audit";
import { getIssuedDocument } from "@/db/queries/issued-documents";
import { canReadDocument } from "@/lib/auth/policy";
import { ensureDocumentPdf } from "@/lib/documents/issue";
import { AppError } from "@/lib/errors";
import { defineRoute } from "@/lib/server/define-route";

export const runtime = "nodejs";

const ID = /^[0-9a-f-]{36}$/;

/**
 * GET /api/documents/:id — an issued document's PDF, the same bytes every time (rendered once
 * from its frozen snapshot, then stored). A tampered id, another firm's document or a kind the
 * role does not handle answers 404; every download is audited. `?download=1` saves instead of showing.
 */
export const GET = defineRoute<"signed-in", undefined, undefined, { id: string }>({ access: "signed-in" }, async ({ req, params, user, db }) => {
  const row = ID.test(params.id) ? await getIssuedDocument(db, params.id) : null;
  if (!row || !canReadDocument(user, row.doc.kind, { orgId: row.request.orgId, createdById: row.request.createdById })) {
    throw new AppError("not_found:document", "That document was not found.");
  }
  const pdf = await ensureDocumentPdf(db, row.doc.id);
  const ip = req.headers.get("x-forwarded-for")?.split(",")[0]?.trim() ?? null;
  await writeAudit(db, { actorId: user.id, action: "document.download", entityType: "issued_document", entityId: row.doc.id, orgId: row.request.orgId, after: { kind: row.doc.kind, number: row.doc.number }, ip });
  const download = new URL(req.url).searchParams.get("download") === "1";
  return new Response(new Uint8Array(pdf), {
    headers: {
      "content-type": "application/pdf",
      "content-length": String(pdf.length),
      "content-disposition": `${download ? "attachment" : "inline"}; filename="${row.doc.number}.pdf"`,
      "cache-control": "private, no-store",
      "x-content-type-options": "nosniff",
    },
  });
});
