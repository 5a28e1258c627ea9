import type { Metadata } from "next";
import { StaffTable } from "@/app/admin/staff/_components/staff-table";
import { PageHeader } from "@/components/ui/card";
import { pagePermission } from "@/lib/auth/page-guard";

export const metadata: Metadata = { title: "Staff" };
export const dynamic = "force-dynamic";

export default async function StaffPage() {
  const user = await pagePermission("admin:staff", "/admin/staff");
  return (
    <>
      <PageHeader title="Staff" subtitle="Roles, controlled-work clearance and access. At least one admin always remains." />
      <StaffTable selfId={user.id} />
    </>
  );
}
