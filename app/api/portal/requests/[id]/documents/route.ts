import { listIssuedDocuments } from "@/db/queries/issued-documents";
import { getRequest } from "@/db/queries/requests";
import { assertCanSee } from "@/lib/auth/guard";
import { canReadDocument } from "@/lib/auth/policy";
import { documentUrl } from "@/lib/documents/links";
import { defineRoute } from "@/lib/server/define-route";

/**
 * GET /api/portal/requests/:id/documents — the documents the bureau issued on a request, oldest
 * first: `[{ kind, number, issuedAt, url }]`. Clients see their own (a client_admin the firm's);
 * staff the kinds their role needs. Another firm's request answers 404.
 */
export const GET = defineRoute<"signed-in", undefined, undefined, { id: string }>({ access: "signed-in", headers: { "cache-control": "no-store" } }, async ({ params, user, db }) => {
  const r = params.id.length <= 64 ? await getRequest(db, params.id) : null;
  const scope = r ? { orgId: r.orgId, createdById: r.createdById } : null;
  assertCanSee(user, scope, "request");
  const docs = (await listIssuedDocuments(db, r!.id)).filter((d) => canReadDocument(user, d.kind, scope));
  return docs.map((d) => ({ kind: d.kind, number: d.number, issuedAt: d.issuedAt.toISOString(), url: documentUrl(d.id) }));
});
