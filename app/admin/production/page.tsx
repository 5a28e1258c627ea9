import type { Metadata } from "next";
import { CellCalendar } from "@/app/admin/production/_components/cell-calendar";
import { ProductionBoard } from "@/app/admin/production/_components/production-board";
import { ButtonLink } from "@/components/ui/button";
import { CardTitle, PageHeader } from "@/components/ui/card";
import { getDb } from "@/db/client";
import { listCurrentCells } from "@/db/queries/catalogue";
import { pagePermission } from "@/lib/auth/page-guard";

export const metadata: Metadata = { title: "Production" };
export const dynamic = "force-dynamic";

export default async function ProductionPage() {
  await pagePermission("production:board", "/admin/production");
  const cells = await listCurrentCells(getDb());
  return (
    <>
      <PageHeader title="Production" subtitle="Orders by stage, and each printing cell's calendar (UTC)." actions={<span className="flex flex-wrap gap-2"><ButtonLink href="/admin/production/capacity" variant="secondary">Capacity, 8 weeks</ButtonLink><ButtonLink href="/admin/production/report" variant="secondary">Actual against estimate</ButtonLink></span>} />
      <ProductionBoard />
      <div className="mt-8 space-y-4">
        <CardTitle>Cell calendars</CardTitle>
        {cells.length === 0 ? <p className="text-sm text-ink-500">No printing cells in the catalogue.</p> : cells.map((c) => <CellCalendar key={c.key} cellKey={c.key} cellName={c.params.name} />)}
      </div>
    </>
  );
}
