import type { Metadata } from "next";
import { LedgerTable } from "@/components/admin/ledger-table";
import { ButtonLink } from "@/components/ui/button";
import { PageHeader } from "@/components/ui/card";
import { pagePermission } from "@/lib/auth/page-guard";

export const metadata: Metadata = { title: "Ledger" };
export const dynamic = "force-dynamic";

export default async function LedgerPage() {
  await pagePermission("accounts:ledger", "/admin/accounts");
  return (
    <>
      <PageHeader title="Ledger" subtitle="Every deposit and balance with its order, amount, processing fee and status." actions={<ButtonLink href="/admin/accounts/reconciliation" variant="secondary">Reconcile with the processor</ButtonLink>} />
      <LedgerTable />
    </>
  );
}
