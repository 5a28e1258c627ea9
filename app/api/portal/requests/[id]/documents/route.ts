import { NextResponse } from "next/server";
import { getDb } from "@/db/client";
import { listIssuedDocuments } from "@/db/queries/issued-documents";
import { getRequest } from "@/db/queries/requests";
import { assertCanSee, requireUser } from "@/lib/auth/guard";
import { canReadDocument } from "@/lib/auth/policy";
import { withErrors } from "@/lib/auth/route";
import { documentUrl } from "@/lib/documents/links";

/**
 * GET /api/portal/requests/:id/documents — the documents the bureau issued on a request, oldest
 * first: `[{ kind, number, issuedAt, url }]`. Clients see their own (a client_admin the firm's);
 * staff the kinds their role needs. Another firm's request answers 404.
 */
export const GET = withErrors(async (_req: Request, ctx: { params: Promise<{ id: string }> }) => {
  const user = await requireUser();
  const { id } = await ctx.params;
  const db = getDb();
  const r = id.length <= 64 ? await getRequest(db, id) : null;
  const scope = r ? { orgId: r.orgId, createdById: r.createdById } : null;
  assertCanSee(user, scope, "request");
  const docs = (await listIssuedDocuments(db, r!.id)).filter((d) => canReadDocument(user, d.kind, scope));
  return NextResponse.json(
    docs.map((d) => ({ kind: d.kind, number: d.number, issuedAt: d.issuedAt.toISOString(), url: documentUrl(d.id) })),
    { headers: { "cache-control": "no-store" } },
  );
});
