import type { EstimateResult } from "@/lib/estimating/types";
import { formatCents } from "@/lib/money";
import { formatHours, formatLength, type UnitsPref } from "@/lib/units";
import { BuildDetails, buildModeText } from "@/components/estimate/build-details";

const when = (iso: string, timeZone: string) =>
  new Date(iso).toLocaleString("en-GB", { weekday: "short", day: "numeric", month: "short", hour: "2-digit", minute: "2-digit", timeZone: timeZone || "UTC", timeZoneName: "short" });
const day = (iso: string) => new Date(`${iso}T12:00:00Z`).toLocaleDateString("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });

/** How the part is built (cell, shell or solid) and the print window, for the client. */
export function EstimatePlan({ r, units, priceWithheld }: { r: EstimateResult; units: UnitsPref; priceWithheld: boolean }) {
  const cellName = r.fits.find((f) => f.cell === r.cell)?.cellName ?? r.cell;
  const others = (r.alternatives ?? []).filter((a) => a.cell !== r.cell);
  const sh = r.shell;
  const s = r.schedule;
  return (
    <section aria-label="Build plan" className="space-y-3 rounded bg-paper-50 p-3 ring-1 ring-paper-200" data-testid="estimate-plan">
      <h4 className="text-sm font-semibold text-ink-700">How we would build it</h4>
      <dl className="grid grid-cols-1 gap-x-4 gap-y-2 text-sm sm:grid-cols-2">
        <div>
          <dt className="text-xs text-ink-500">Printing cell</dt>
          <dd className="font-medium text-ink-800" data-testid="plan-cell">{cellName}</dd>
        </div>
        <div>
          <dt className="text-xs text-ink-500">Build</dt>
          <dd className="text-ink-800" data-testid="plan-mode">
            {r.printMode?.startsWith("vertical-") ? `${buildModeText(r.printMode)}. ` : ""}
            {sh
              ? `Shell: ${sh.walls} walls (${formatLength(sh.wallThicknessMm, units, 0)}), internal ribs every ${formatLength(sh.ribSpacingMm, units, 0)}, closed top and bottom skins`
              : "Solid print"}
          </dd>
        </div>
        {s?.printStart && s.printContinuous ? (
          <div className="sm:col-span-2">
            <dt className="text-xs text-ink-500">Printing (runs day and night once started)</dt>
            <dd className="text-ink-800" data-testid="plan-print-window">
              {when(s.printStart, s.timeZone)} → {when(s.printEnd, s.timeZone)} · {formatHours(r.printHours + r.dwellHours)}
            </dd>
          </div>
        ) : null}
      </dl>
      <BuildDetails r={r} priceWithheld={priceWithheld} />
      {others.length ? (
        <div>
          <p className="text-xs text-ink-500">Other cells we compared</p>
          <ul className="mt-1 divide-y divide-paper-200 text-sm" data-testid="plan-alternatives">
            {others.map((a) => (
              <li key={a.cell} className="flex flex-wrap justify-between gap-x-4 py-1">
                <span className="text-ink-700">{a.cellName}</span>
                <span className="figures text-ink-600">
                  {priceWithheld ? "" : `${formatCents(a.totalCents)} · `}ships {day(a.shipDate)}
                </span>
              </li>
            ))}
          </ul>
        </div>
      ) : null}
    </section>
  );
}
