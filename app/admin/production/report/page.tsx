import type { Metadata } from "next";
import { ActualsReport } from "@/app/admin/production/report/_components/actuals-report";
import { ButtonLink } from "@/components/ui/button";
import { PageHeader } from "@/components/ui/card";
import { pagePermission } from "@/lib/auth/page-guard";

export const metadata: Metadata = { title: "Actual against estimate" };
export const dynamic = "force-dynamic";

export default async function ActualsReportPage() {
  await pagePermission("production:board", "/admin/production/report");
  return (
    <>
      <PageHeader title="Actual against estimate" subtitle="For calibrating the estimator: what jobs really took, per order and per material." actions={<ButtonLink href="/admin/production" variant="secondary">Board</ButtonLink>} />
      <ActualsReport />
    </>
  );
}
