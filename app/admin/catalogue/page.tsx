import type { Metadata } from "next";
import { ParamsForm } from "@/app/admin/catalogue/_components/params-form";
import { Badge } from "@/components/ui/badge";
import { Card, CardTitle, PageHeader } from "@/components/ui/card";
import { getDb } from "@/db/client";
import { countVersions } from "@/db/queries/admin-catalogue";
import { getCurrentRateCard, listCurrentCells, listCurrentMaterials } from "@/db/queries/catalogue";
import { getBureauSettings } from "@/db/queries/retention";
import { pagePermission } from "@/lib/auth/page-guard";
import { RetentionForm } from "./_components/retention-form";
import { FreightZonesForm } from "./_components/freight-zones-form";
import { formatCents } from "@/lib/money";
import { cellFormValues, rateCardFormValues } from "@/lib/validation/admin-catalogue";

export const metadata: Metadata = { title: "Catalogue" };
export const dynamic = "force-dynamic";

export default async function CataloguePage() {
  await pagePermission("admin:catalogue", "/admin/catalogue");
  const db = getDb();
  const [materials, cells, card, versions, settings] = await Promise.all([listCurrentMaterials(db, { activeOnly: false }), listCurrentCells(db, { activeOnly: false }), getCurrentRateCard(db), countVersions(db), getBureauSettings(db)]);
  return (
    <>
      <PageHeader title="Catalogue" subtitle="Materials, printing cells and the rate card. Each save adds a version; old quotes keep the values they were made with." />
      <div className="space-y-8">
        <Card>
          <CardTitle>Rate card {card ? <Badge tone="info">version {card.version}</Badge> : null}</CardTitle>
          <div className="mt-3">
            {card ? <ParamsForm kind="rateCard" idPrefix="rc" initial={rateCardFormValues(card.params)} /> : <p className="text-sm text-ink-500">No rate card yet.</p>}
          </div>
        </Card>
        <Card className="space-y-3">
          <CardTitle>Freight by destination</CardTitle>
          <p className="text-sm text-ink-600">
            Estimates price each crate to the client&apos;s default ship-to; acceptance prices it again for the ship-to picked.
          </p>
          {card?.params.freight ? <FreightZonesForm initial={card.params.freight} /> : <p className="text-sm text-ink-500">This rate card has no zone table; freight is its flat base and rate per kg.</p>}
        </Card>
        <Card className="space-y-3">
          <CardTitle>Clients&apos; model files</CardTitle>
          <p className="text-sm text-ink-600">
            A daily job deletes the model files of orders closed or cancelled longer ago than this, and records each deletion in the
            audit log; quotes, invoices, reports and the orders&apos; records stay. Clients see the period on their firm page.
          </p>
          <RetentionForm initialDays={settings.modelRetentionDays} />
        </Card>
        <section className="space-y-2">
          <CardTitle>Materials</CardTitle>
          {materials.length === 0 ? <p className="text-sm text-ink-500">No materials yet.</p> : null}
          <details className="rounded-md bg-paper-50 ring-1 ring-paper-200">
            <summary className="cursor-pointer px-4 py-3 text-sm font-medium text-kiln-700">+ Add a material</summary>
            <div className="border-t border-paper-200 p-4">
              <p className="mb-3 text-sm text-ink-600">Starts from {materials[0] ? `${materials[0].params.name}'s figures` : "blank figures"}; give it its own key, name and figures, and say where the figures come from. It becomes version 1.</p>
              <ParamsForm kind="material" idPrefix="m-new" initial={{ ...(materials[0]?.params ?? {}), key: "", name: "", notes: "", source: "", isActive: true }} />
            </div>
          </details>
          {materials.map((m) => (
            <details key={m.key} className="rounded-md bg-white ring-1 ring-paper-200">
              <summary className="flex cursor-pointer flex-wrap items-center gap-2 px-4 py-3 text-sm">
                <span className="font-medium text-ink-800">{m.params.name}</span>
                <span className="text-ink-500">{m.params.densityGPerCm3} g/cm³ · {formatCents(m.params.pricePerKgCents)}/kg · service to {m.params.maxServiceTempC} °C</span>
                <Badge>v{m.version} of {versions.materials.get(m.key) ?? 1}</Badge>
                {!m.isActive ? <Badge tone="warn">out of service</Badge> : null}
              </summary>
              <div className="border-t border-paper-200 p-4">
                <ParamsForm kind="material" idPrefix={`m-${m.key}`} keyLocked initial={{ ...m.params, isActive: m.isActive }} />
              </div>
            </details>
          ))}
        </section>
        <section className="space-y-2">
          <CardTitle>Printing cells</CardTitle>
          <details className="rounded-md bg-paper-50 ring-1 ring-paper-200">
            <summary className="cursor-pointer px-4 py-3 text-sm font-medium text-kiln-700">+ Add a printing cell</summary>
            <div className="border-t border-paper-200 p-4">
              <p className="mb-3 text-sm text-ink-600">Starts from {cells[0] ? `${cells[0].params.name}'s settings` : "blank settings"}; give it its own key, name, envelope and rates. It becomes version 1.</p>
              <ParamsForm kind="cell" idPrefix="c-new" initial={{ ...(cells[0] ? cellFormValues(cells[0].params) : {}), key: "", name: "", isActive: true }} />
            </div>
          </details>
          {cells.map((c) => (
            <details key={c.key} className="rounded-md bg-white ring-1 ring-paper-200">
              <summary className="flex cursor-pointer flex-wrap items-center gap-2 px-4 py-3 text-sm">
                <span className="font-medium text-ink-800">{c.params.name}</span>
                <span className="text-ink-500">{c.params.envelopeMm.x} × {c.params.envelopeMm.y} × {c.params.envelopeMm.z} mm · {c.params.extruderOutputKgPerH} kg/h</span>
                <Badge>v{c.version} of {versions.cells.get(c.key) ?? 1}</Badge>
                {!c.isActive ? <Badge tone="warn">out of service</Badge> : null}
              </summary>
              <div className="border-t border-paper-200 p-4">
                <ParamsForm kind="cell" idPrefix={`c-${c.key}`} keyLocked initial={{ ...cellFormValues(c.params), isActive: c.isActive }} />
              </div>
            </details>
          ))}
        </section>
      </div>
    </>
  );
}
