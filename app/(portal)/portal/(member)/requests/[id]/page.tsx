import type { Metadata } from "next";
import { getDb } from "@/db/client";
import { getRequest } from "@/db/queries/requests";
import { assertCanSee } from "@/lib/auth/guard";
import { orPageError, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/policy";
import { DraftEditor } from "./_components/draft-editor";
import { RequestView } from "./_components/request-view";

export const metadata: Metadata = { title: "Request" };
export const dynamic = "force-dynamic";

export default async function RequestPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<Record<string, string | undefined>> }) {
  const { id } = await params;
  const sp = await searchParams;
  const user = await pageUser(`/portal/requests/${id}`);
  const db = getDb();
  const req = await orPageError(async () => {
    const r = await getRequest(db, id);
    assertCanSee(user, r ? { orgId: r.orgId, createdById: r.createdById } : null, "request");
    return r!;
  });

  if (req.stage === "draft" && can(user, "request:edit_draft", { orgId: req.orgId, createdById: req.createdById })) return <DraftEditor req={req} units={user.unitsPref} />;
  return <RequestView user={user} req={req} sp={sp} />;
}
