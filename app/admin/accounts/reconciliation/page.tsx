import type { Metadata } from "next";
import { ReconciliationView } from "@/app/admin/accounts/reconciliation/_components/reconciliation-view";
import { ButtonLink } from "@/components/ui/button";
import { PageHeader } from "@/components/ui/card";
import { pagePermission } from "@/lib/auth/page-guard";

export const metadata: Metadata = { title: "Reconciliation" };
export const dynamic = "force-dynamic";

export default async function ReconciliationPage() {
  await pagePermission("accounts:ledger", "/admin/accounts/reconciliation");
  return (
    <>
      <PageHeader title="Reconciliation" subtitle="Our ledger against the card processor's records: payments received, their fees, and refunds." actions={<ButtonLink href="/admin/accounts" variant="secondary">Ledger</ButtonLink>} />
      <ReconciliationView />
    </>
  );
}
