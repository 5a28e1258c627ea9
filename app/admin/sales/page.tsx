import type { Metadata } from "next";
import { InboxTable } from "@/app/admin/sales/_components/inbox-table";
import { ButtonLink } from "@/components/ui/button";
import { PageHeader } from "@/components/ui/card";
import { getDb } from "@/db/client";
import { pagePermission } from "@/lib/auth/page-guard";
import { PromisedDates } from "./_components/promised-dates";

export const metadata: Metadata = { title: "Sales inbox" };
export const dynamic = "force-dynamic";

export default async function SalesInboxPage() {
  await pagePermission("sales:inbox", "/admin/sales");
  return (
    <>
      <PageHeader
        title="Sales inbox"
        subtitle="Submitted requests and stale quotes, nearest due date first, then the oldest."
        actions={<ButtonLink href="/admin/sales/quotes" variant="secondary">Quotes by status</ButtonLink>}
      />
      <InboxTable />
      <PromisedDates db={getDb()} now={new Date()} />
    </>
  );
}
