import type { Metadata } from "next";
import { ShipToBlock } from "@/components/ship-to";
import { notFound } from "next/navigation";
import { dateText, dateTimeText, hoursText, stageText } from "@/components/admin/format";
import { ActualsForm, ScheduleForm, StageForm } from "@/app/admin/production/orders/[id]/_components/order-forms";
import { listShipDateChanges } from "@/db/queries/ship-dates";
import { moveBookedJob, recordBlockEnd } from "./actions";
import { BlockEndForm, MoveJobForm } from "./_components/move-job-form";
import { StageBadge } from "@/components/stage-badge";
import { Alert } from "@/components/ui/alert";
import { OrderDocumentsCard } from "@/components/admin/order-documents";
import { Card, CardTitle, PageHeader } from "@/components/ui/card";
import { getDb } from "@/db/client";
import { listCurrentCells } from "@/db/queries/catalogue";
import { getOrderForProduction, listInspectionReports } from "@/db/queries/orders";
import { estimateTotals } from "@/lib/quoting/actuals";
import { STAGES } from "@/db/schema/common";
import { pagePermission } from "@/lib/auth/page-guard";
import { hasPermission } from "@/lib/auth/policy";
import { nextPlantMonday, toPlantInput } from "@/lib/dates";
import { formatCents } from "@/lib/money";
import { checkTransition, isBackwardMove, orderMoves, roleMayMove } from "@/lib/orders/stages";

export const metadata: Metadata = { title: "Order" };
export const dynamic = "force-dynamic";

export default async function ProductionOrderPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const user = await pagePermission("production:board", `/admin/production/orders/${id}`);
  const db = getDb();
  const o = await getOrderForProduction(db, id);
  if (!o) notFound();
  const [cells, reports, dateChanges] = await Promise.all([listCurrentCells(db), listInspectionReports(db, o.request.id), listShipDateChanges(db, o.order.id)]);
  const stage = o.request.stage;
  const est = estimateTotals(o.parts);
  const options = orderMoves(
    stage,
    STAGES.filter((s) => s !== "scheduled" || stage === "on_hold")
      .map((s) => ({ stage: s, ...checkTransition(stage, s, o.request.heldFromStage), isBack: isBackwardMove(stage, s) }))
      .filter((x) => x.ok && roleMayMove(user.role, stage, x.stage)),
  );
  const defaultCell = o.order.cellKey ?? o.parts.map((p) => (p.estimate as { cell?: string } | null)?.cell).find(Boolean) ?? cells[0]?.key ?? "";
  const nextMonday = toPlantInput(nextPlantMonday(new Date()));
  const canSchedule = hasPermission(user, "production:schedule") && (stage === "deposit_paid" || stage === "scheduled");
  const canRecord = hasPermission(user, "production:record");
  const canMove = hasPermission(user, "production:schedule") && o.blocks.length > 0 && ["scheduled", "printing", "cooling", "machining", "on_hold"].includes(stage);
  const moveContext = {
    from: stage,
    paidCents: o.payments.filter((p) => p.status === "paid" || p.status === "partially_refunded").reduce((sum, p) => sum + p.amountCents, 0),
    currency: o.order.currency,
    bookedCell: o.blocks.length ? (cells.find((c) => c.key === o.order.cellKey)?.params.name ?? o.order.cellKey) : null,
  };

  return (
    <>
      <PageHeader
        title={`${o.request.reference} · ${o.request.projectName}`}
        subtitle={<span className="flex flex-wrap items-center gap-2">{o.firmName} · PO {o.order.poNumber} · total {formatCents(o.order.totalCents, o.order.currency)} <StageBadge stage={stage} /></span>}
      />
      <div className="grid gap-6 lg:grid-cols-2">
        <div className="min-w-0 space-y-4">
          <Card>
            <CardTitle>Plan</CardTitle>
            <dl className="mt-2 grid grid-cols-2 gap-2 text-sm">
              <div><dt className="text-xs text-ink-500">Cell</dt><dd>{cells.find((c) => c.key === o.order.cellKey)?.params.name ?? "not scheduled"}</dd></div>
              <div><dt className="text-xs text-ink-500">Planned start / ship</dt><dd>{dateTimeText(o.order.plannedStart)} / {dateText(o.order.plannedShip)}</dd></div>
              <div><dt className="text-xs text-ink-500">Estimated print + dwell</dt><dd className="figures">{hoursText(est.printHours)}</dd></div>
              <div><dt className="text-xs text-ink-500">Estimated machining</dt><dd className="figures">{hoursText(est.machiningHours)}</dd></div>
            </dl>
            {o.blocks.length ? (
              <ul className="mt-3 space-y-1 text-sm">
                {o.blocks.map((b) => <li key={b.id} className="figures"><span className="inline-block w-20 font-medium">{b.kind}</span>{dateTimeText(b.startsAt)} – {dateTimeText(b.endsAt)}</li>)}
              </ul>
            ) : null}
            <div className="mt-4">
              {canSchedule ? (
                <ScheduleForm orderId={id} cells={cells.map((c) => ({ key: c.key, name: c.params.name }))} defaultCell={defaultCell} defaultStart={o.order.plannedStart ? toPlantInput(o.order.plannedStart) : nextMonday} />
              ) : stage === "accepted" ? (
                <Alert tone="info" title="Waiting for the deposit">Only paid orders are laid on a cell.</Alert>
              ) : null}
            </div>
            {canMove && stage !== "scheduled" ? (
              <div className="mt-4 border-t border-paper-200 pt-4">
                <MoveJobForm action={moveBookedJob} orderId={id} defaultStart={o.order.plannedStart ? toPlantInput(o.order.plannedStart) : nextMonday} />
              </div>
            ) : null}
            {canMove && stage !== "scheduled" ? (
              <details className="mt-4 border-t border-paper-200 pt-4">
                <summary className="cursor-pointer text-sm font-medium text-ink-700">A step finished early or runs late</summary>
                <div className="mt-3">
                  <BlockEndForm action={recordBlockEnd} orderId={id} kinds={(["print", "cooling", "machining"] as const).filter((k) => o.blocks.some((b) => b.kind === k))} defaultEnd={toPlantInput(new Date())} />
                </div>
              </details>
            ) : null}
            {canMove && stage === "scheduled" ? (
              <details className="mt-4 border-t border-paper-200 pt-4">
                <summary className="cursor-pointer text-sm font-medium text-ink-700">Move the job and tell the clients affected</summary>
                <div className="mt-3"><MoveJobForm action={moveBookedJob} orderId={id} defaultStart={o.order.plannedStart ? toPlantInput(o.order.plannedStart) : nextMonday} /></div>
              </details>
            ) : null}
            {dateChanges.length ? (
              <div className="mt-4 border-t border-paper-200 pt-3">
                <p className="text-xs font-medium text-ink-500">Ship-date changes</p>
                <ul className="mt-1 space-y-1 text-sm">
                  {dateChanges.map((c) => <li key={c.id}><span className="figures">{dateText(c.fromDate)} → {dateText(c.toDate)}</span> · {c.reason} <span className="text-xs text-ink-500">({dateTimeText(c.at)})</span></li>)}
                </ul>
              </div>
            ) : null}
          </Card>
          <Card>
            <CardTitle>Stage</CardTitle>
            <div className="mt-2">{canRecord ? <StageForm orderId={id} options={options} context={moveContext} /> : <p className="text-sm text-ink-500">Your role views the board only.</p>}</div>
            {stage === "packed" ? <p className="mt-2 text-xs text-ink-500">Shipping needs the carrier and tracking number below; it sends the client the tracking and the balance invoice.</p> : null}
          </Card>
          <Alert tone="warn" title="Handling cautions">
            Printed tools leave the cell hot and are heavy: lift with rated equipment, wear heat-resistant gloves while it cools, and keep clear of machining chips. Follow your site&rsquo;s procedures and local codes.
          </Alert>
        </div>
        <div className="min-w-0 space-y-4">
          <Card>
            <ShipToBlock shipTo={o.order.shipTo} />
          </Card>
          <Card>
            <CardTitle>Actuals, inspection and shipping</CardTitle>
            <div className="mt-2">
              {canRecord ? <ActualsForm orderId={id} initial={{ actualPrintHours: o.order.actualPrintHours, actualMaterialKg: o.order.actualMaterialKg, actualMachiningHours: o.order.actualMachiningHours, inspectionResult: o.order.inspectionResult, inspectionNotes: o.order.inspectionNotes, carrier: o.order.carrier, trackingNumber: o.order.trackingNumber }} reports={reports.map((r) => ({ id: r.id, fileName: r.fileName ?? r.title, filedAt: dateTimeText(r.createdAt) }))} /> : <p className="text-sm text-ink-500">Your role views the board only.</p>}
            </div>
          </Card>
          <OrderDocumentsCard requestId={o.request.id} user={user} />
          <Card>
            <CardTitle>History</CardTitle>
            {o.events.length === 0 ? <p className="mt-2 text-sm text-ink-500">No stage changes recorded.</p> : (
              <ol className="mt-2 space-y-1 text-sm">
                {o.events.map((e) => (
                  <li key={e.id}><span className="figures text-ink-500">{dateTimeText(e.at)}</span> {e.fromStage ? stageText(e.fromStage) : "—"} → <strong>{stageText(e.toStage)}</strong> {e.actor ? `by ${e.actor}` : ""}{e.note ? ` · ${e.note}` : ""}</li>
                ))}
              </ol>
            )}
          </Card>
        </div>
      </div>
    </>
  );
}
