import type { Metadata } from "next";
import { AuditTable } from "@/app/admin/audit/_components/audit-table";
import { PageHeader } from "@/components/ui/card";
import { pagePermission } from "@/lib/auth/page-guard";

export const metadata: Metadata = { title: "Audit log" };
export const dynamic = "force-dynamic";

export default async function AuditPage() {
  await pagePermission("admin:audit", "/admin/audit");
  return (
    <>
      <PageHeader title="Audit log" subtitle="Who changed what and when, and every file download." />
      <AuditTable />
    </>
  );
}
