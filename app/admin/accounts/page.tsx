import type { Metadata } from "next";
import { LedgerTable } from "@/app/admin/accounts/_components/ledger-table";
import { ButtonLink } from "@/components/ui/button";
import { PageHeader } from "@/components/ui/card";
import { pagePermission } from "@/lib/auth/page-guard";

export const metadata: Metadata = { title: "Ledger" };
export const dynamic = "force-dynamic";

export default async function LedgerPage() {
  await pagePermission("accounts:ledger", "/admin/accounts");
  return (
    <>
      <PageHeader title="Ledger" subtitle="Every deposit and balance with its order, amount, processing fee and status." actions={
          <span className="flex flex-wrap gap-2">
            <ButtonLink href="/admin/accounts/terms" variant="secondary">Terms and credit</ButtonLink>
            <ButtonLink href="/admin/accounts/transfers" variant="secondary">Bank transfers</ButtonLink>
            <ButtonLink href="/admin/accounts/reconciliation" variant="secondary">Reconcile with the processor</ButtonLink>
          </span>
        } />
      <LedgerTable />
    </>
  );
}
