import type { Metadata } from "next";
import { getDb } from "@/db/client";
import { RequestForm } from "@/app/(portal)/portal/(member)/requests/_components/request-form/request-form";
import { blankDraft, loadFormCatalogue } from "@/app/(portal)/portal/(member)/requests/_components/request-form/load";
import { PageHeader } from "@/components/ui/card";
import { pagePermission } from "@/lib/auth/page-guard";

export const metadata: Metadata = { title: "New request" };
export const dynamic = "force-dynamic";

export default async function NewRequestPage() {
  const user = await pagePermission("request:create", "/portal/requests/new");
  const catalogue = await loadFormCatalogue(getDb(), user.unitsPref);
  return (
    <>
      <PageHeader title="New request" subtitle="Describe the project, upload each part, and see the automatic estimate before you submit." />
      <RequestForm initial={blankDraft(user.unitsPref)} initialFiles={{}} reference={null} catalogue={catalogue} />
    </>
  );
}
