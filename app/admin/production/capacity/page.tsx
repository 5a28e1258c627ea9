import type { Metadata } from "next";
import { ButtonLink } from "@/components/ui/button";
import { Card, CardTitle, PageHeader } from "@/components/ui/card";
import { getDb } from "@/db/client";
import { listBookedBlocks, listMaintenanceBlocks, listUnscheduledEstimates } from "@/db/queries/capacity";
import { getCurrentRateCard, listCurrentCells } from "@/db/queries/catalogue";
import { pagePermission } from "@/lib/auth/page-guard";
import { formatDate, formatDateTime, zoneLabel } from "@/lib/dates";
import { ROUTER_KEY } from "@/lib/estimating/ledger";
import { unscheduledOf } from "@/lib/estimating/queue";
import { plantOf } from "@/lib/estimating/stages/schedule";
import { capacityWeeks, plantMonday } from "@/lib/scheduling/capacity";
import { blockResource, removeBlock } from "./actions";
import { BlockForm, RemoveBlockButton } from "./_components/block-form";
import { CapacityChart } from "./_components/capacity-chart";

export const metadata: Metadata = { title: "Capacity" };
export const dynamic = "force-dynamic";

const WEEKS = 8;

export default async function CapacityPage() {
  await pagePermission("production:capacity", "/admin/production/capacity");
  const db = getDb();
  const now = new Date();
  const [cells, card] = await Promise.all([listCurrentCells(db), getCurrentRateCard(db)]);
  const active = cells.filter((c) => c.isActive);
  const plant = card ? plantOf(card.params) : { timeZone: "UTC", dayStartHour: 6, holidays: [] };
  const fromMonday = plantMonday(now, plant);
  const from = new Date(`${fromMonday}T00:00:00Z`);
  const to = new Date(from.getTime() + (WEEKS + 1) * 7 * 86_400_000);
  const [booked, blocks, waiting] = await Promise.all([listBookedBlocks(db, from, to), listMaintenanceBlocks(db, from, to), listUnscheduledEstimates(db)]);
  const routerCal = card?.params.routerCalendar ?? active[0]?.params.calendar ?? { workingWeekdays: [1, 2, 3, 4, 5], shiftsPerDay: 2, hoursPerShift: 8, holidays: [] };
  const resources = [...active.map((c) => ({ key: c.key, name: c.params.name, calendar: c.params.calendar })), { key: ROUTER_KEY, name: "Router", calendar: routerCal }];
  const rows = capacityWeeks({
    fromMonday, weeks: WEEKS, now, plant, resources,
    held: booked.filter((b) => b.kind !== "finishing").map((b) => ({ resourceKey: b.kind === "machining" ? ROUTER_KEY : b.cellKey, orderId: b.orderId, reference: b.reference, startsAt: b.startsAt, endsAt: b.endsAt })),
    waiting: waiting.flatMap((w) => {
      const u = unscheduledOf(w.estimate);
      if (!u) return [];
      return [
        { resourceKey: u.cellKey, orderId: w.orderId, reference: w.reference, hours: u.cellHours, promisedShip: w.promisedShip },
        ...(u.machiningHours > 0 ? [{ resourceKey: ROUTER_KEY, orderId: w.orderId, reference: w.reference, hours: u.machiningHours, promisedShip: w.promisedShip }] : []),
      ];
    }),
    blocks: blocks.map((b) => ({ resourceKey: b.resourceKey, startsAt: b.startsAt, endsAt: b.endsAt, reason: b.reason })),
  });
  const nameOf = (key: string) => resources.find((r) => r.key === key)?.name ?? key;
  const upcoming = blocks.filter((b) => b.endsAt.getTime() > now.getTime());

  return (
    <>
      <PageHeader
        title="Capacity"
        subtitle={`Booked against available shift hours for the next ${WEEKS} weeks, from the week of ${formatDate(from)} (plant time, ${zoneLabel()}).`}
        actions={<ButtonLink href="/admin/production" variant="secondary">Back to production</ButtonLink>}
      />
      <CapacityChart rows={rows} />
      <div className="mt-8 grid gap-6 lg:grid-cols-2">
        <Card>
          <CardTitle>Take a cell or the router out of service</CardTitle>
          <p className="mt-1 text-sm text-ink-500">New estimates and bookings go around the block. Lock out and tag out the machine as your local codes and licensed practice require before work on it.</p>
          <div className="mt-3">
            <BlockForm action={blockResource} resources={resources.map((r) => ({ key: r.key, name: r.name }))} />
          </div>
        </Card>
        <Card>
          <CardTitle>Maintenance blocks</CardTitle>
          {upcoming.length === 0 ? (
            <p className="mt-2 text-sm text-ink-500">None planned.</p>
          ) : (
            <ul className="mt-2 divide-y divide-paper-200 text-sm">
              {upcoming.map((b) => (
                <li key={b.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
                  <span className="min-w-0">
                    <span className="font-medium">{nameOf(b.resourceKey)}</span>: {b.reason}
                    <span className="block text-xs text-ink-500 figures">{formatDateTime(b.startsAt)} – {formatDateTime(b.endsAt)}</span>
                  </span>
                  <RemoveBlockButton action={removeBlock} id={b.id} label={`Remove the block on ${nameOf(b.resourceKey)}`} />
                </li>
              ))}
            </ul>
          )}
        </Card>
      </div>
    </>
  );
}
