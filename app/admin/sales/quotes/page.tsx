import type { Metadata } from "next";
import { QuotesTable } from "@/app/admin/sales/quotes/_components/quotes-table";
import { ButtonLink } from "@/components/ui/button";
import { PageHeader } from "@/components/ui/card";
import { pagePermission } from "@/lib/auth/page-guard";

export const metadata: Metadata = { title: "Quotes" };
export const dynamic = "force-dynamic";

export default async function QuotesPage() {
  await pagePermission("quote:manage", "/admin/sales/quotes");
  return (
    <>
      <PageHeader title="Quotes" subtitle="Every version by status; won and lost count once per request." actions={<ButtonLink href="/admin/sales" variant="secondary">Inbox</ButtonLink>} />
      <QuotesTable />
    </>
  );
}
