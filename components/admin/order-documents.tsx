import { IssuedDocumentsList } from "@/components/issued-documents";
import { Card, CardTitle } from "@/components/ui/card";
import { getDb } from "@/db/client";
import { getRequest } from "@/db/queries/requests";
import { listIssuedDocuments } from "@/db/queries/issued-documents";
import type { CurrentUser } from "@/lib/auth/guard";
import { canReadDocument } from "@/lib/auth/policy";

/** The issued documents of a request that this staff member's role handles, as a card. */
export async function OrderDocumentsCard({ requestId, user }: { requestId: string; user: CurrentUser }) {
  const db = getDb();
  const [req, docs] = await Promise.all([getRequest(db, requestId), listIssuedDocuments(db, requestId)]);
  if (!req) return null;
  const mine = docs.filter((d) => canReadDocument(user, d.kind, { orgId: req.orgId, createdById: req.createdById }));
  return (
    <Card>
      <CardTitle>Documents</CardTitle>
      <div className="mt-2">
        <IssuedDocumentsList docs={mine} empty="No documents your role handles have been issued on this order yet." />
      </div>
    </Card>
  );
}
