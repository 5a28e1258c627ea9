import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { spreadMargin } from "@/lib/quoting/client-lines";
import { clientQuantity, CostLines } from "./cost-lines";
import { EstimatePlan } from "./estimate-plan";
import type { EstimateResult } from "@/lib/estimating/types";
import { formatCents } from "@/lib/money";
import {
  formatHours,
  formatLength,
  formatMass,
  formatSize,
  formatTemp,
  formatVolume,
  type UnitsPref,
} from "@/lib/units";
import { formatDay } from "@/lib/dates";

const day = (iso: string) => formatDay(iso);

/** The label every figure carries: automatic estimate or sales-approved quote. */
export function FigureKind({ kind }: { kind: "estimate" | "quote" }) {
  return kind === "estimate" ? (
    <Badge tone="info">Automatic estimate</Badge>
  ) : (
    <Badge tone="ok">Sales-approved quote</Badge>
  );
}

function Figure({
  label,
  value,
  hint,
}: {
  label: string;
  value: React.ReactNode;
  hint?: string;
}) {
  return (
    <div className="rounded bg-paper-50 px-3 py-2 ring-1 ring-paper-200">
      <dt className="text-xs text-ink-500">{label}</dt>
      <dd className="figures text-base font-semibold text-ink-900">{value}</dd>
      {hint ? <dd className="text-xs text-ink-400">{hint}</dd> : null}
    </div>
  );
}

/** Safety cautions for one part: heavy tools and molds rated below the cure temperature. */
export function PartCautions({
  r,
  cureTempC,
  units,
}: {
  r: EstimateResult;
  cureTempC: number | null;
  units: UnitsPref;
}) {
  const tooHot = cureTempC !== null && cureTempC > r.material.maxServiceTempC;
  return (
    <>
      {r.liftingCaution ? (
        <Alert
          tone="warn"
          title={`Heavy tool: about ${formatMass(r.partMassKg, units)} machined (${formatMass(r.massKg, units)} of material laid)`}
        >
          <p>
            Plan the lift: use rated lifting gear and trained people, follow
            your site&rsquo;s lifting procedures and local codes. Ask us for
            lifting points or a base frame if you need them.
          </p>
        </Alert>
      ) : null}
      {tooHot ? (
        <Alert
          tone="danger"
          title={`${r.material.name} is rated to ${formatTemp(r.material.maxServiceTempC, units)}; your cure is ${formatTemp(cureTempC, units)}`}
        >
          <p>
            A mold used above its material&rsquo;s service temperature can
            soften, creep or fail under autoclave pressure. Choose a
            higher-temperature material, or have your own engineers sign off
            this use; we build to your engineering approval and local codes.
          </p>
        </Alert>
      ) : null}
    </>
  );
}

/** The engine's result for one part, labelled as an automatic estimate throughout. */
export function EstimatePanel({
  r,
  units,
  cureTempC,
}: {
  r: EstimateResult & { priceWithheld?: boolean };
  units: UnitsPref;
  cureTempC: number | null;
}) {
  const fitting = r.fits.filter((f) => f.fits);
  const chosen = r.fits.find((f) => f.cell === r.cell);
  const review = r.status === "needs-review";
  const withheld = review && r.priceWithheld !== false;
  return (
    <div className="space-y-4" data-testid="estimate-panel">
      <div className="flex flex-wrap items-center gap-2">
        <FigureKind kind="estimate" />
        {review ? (
          <Badge tone="warn">Engineer&rsquo;s quote needed</Badge>
        ) : null}
        <span className="text-xs text-ink-500">
          Computed from your file and our rate card; a sales engineer reviews it
          before quoting.
        </span>
      </div>
      {review ? (
        <div data-testid="estimate-review">
          <Alert tone="warn" title="Our engineer will quote this part">
            <p>
              The automatic plan could not settle every point, so we do not show
              a price for it. The bureau&rsquo;s engineer plans it and sends you
              a quote.
            </p>
            {r.reviewReasons?.length ? (
              <ul className="mt-1 list-disc pl-5">
                {r.reviewReasons.map((x) => (
                  <li key={x.code}>{x.message}</li>
                ))}
              </ul>
            ) : null}
          </Alert>
        </div>
      ) : null}
      <dl className="grid grid-cols-2 gap-2 sm:grid-cols-4">
        <Figure
          label="Estimated total"
          value={withheld ? "Engineer's quote" : formatCents(r.totalCents)}
          hint={
            withheld
              ? "no automatic price"
              : `deposit ${formatCents(r.depositCents)}`
          }
        />
        <Figure
          label="Earliest ship date"
          value={day(r.shipDate)}
          hint="estimate"
        />
        <Figure
          label="Print"
          value={formatHours(r.printHours)}
          hint={`+ ${formatHours(r.dwellHours)} dwell, ${r.layers.toLocaleString("en-US")} layers`}
        />
        <Figure
          label="Machining"
          value={formatHours(r.machiningHours)}
          hint={`stepover ${formatLength(r.machining.stepoverMm, units, 2)}`}
        />
        <Figure
          label="Material laid"
          value={formatMass(r.massKg, units)}
          hint={r.material.name}
        />
        <Figure
          label="Part mass"
          value={formatMass(r.partMassKg, units)}
          hint="after machining"
        />
        <Figure
          label="Part size"
          value={formatSize(r.bboxMm, units)}
          hint={`volume ${formatVolume(r.volumeMm3, units)}`}
        />
        <Figure
          label="Near-net volume"
          value={formatVolume(r.nearNetVolumeMm3, units)}
          hint={`allowance ${formatLength(r.allowanceMm, units, 2)}`}
        />
      </dl>

      {r.alternatives ? (
        <EstimatePlan r={r} units={units} priceWithheld={withheld} />
      ) : null}

      <PartCautions r={r} cureTempC={cureTempC} units={units} />

      {!r.fitsAny ? (
        <Alert tone="warn" title="Too large for any of our cells in one piece">
          {r.split ? (
            <p>
              Split along {r.split.axis} into {r.split.pieces} pieces of about{" "}
              {formatLength(r.split.pieceLengthMm, units, 0)}; each then fits
              the {r.fits.find((f) => f.cell === r.split!.cell)?.cellName ?? "largest"} cell with{" "}
              {formatLength(r.split.marginMm, units, 0)} to spare. We can
              discuss the joint design with you.
            </p>
          ) : (
            <p>Talk to us about splitting it.</p>
          )}
        </Alert>
      ) : (
        <p className="text-sm text-ink-600">
          Fits {fitting.map((f) => `${f.cellName} (${formatLength(f.marginMm, units, 0)} clearance)`).join(", ")}.{" "}
          {chosen ? `Estimated on ${chosen.cellName}.` : ""}
        </p>
      )}
      {r.warnings.length ? (
        <ul className="space-y-1 text-sm">
          {r.warnings.map((w) => (
            <li
              key={w.code + w.message}
              className="rounded bg-amber-50 px-3 py-1.5 text-amber-900"
            >
              {w.message}
            </li>
          ))}
        </ul>
      ) : null}
      {!r.watertight ? (
        <p className="text-sm text-signal-warn">
          The mesh is not closed ({r.openEdges} open edges, {r.nonManifoldEdges}{" "}
          non-manifold): volumes are approximate. A closed export gives a firmer
          estimate.
        </p>
      ) : null}

      {withheld ? null : (
        <CostLines
          heading="Line (estimate)"
          caption="Estimated cost lines"
          lines={spreadMargin(r.lines.filter((l) => l.quantity > 0), r.marginCents).map((l) => ({ key: l.key, label: l.label, quantity: clientQuantity(l.quantity, l.unit), amountCents: l.amountCents }))}
          totals={[
            { label: "Tax", cents: r.taxCents },
            { label: "Estimated total", cents: r.totalCents, tone: "total" },
          ]}
        />
      )}
      {r.cautions.length ? (
        <ul className="list-disc space-y-1 pl-5 text-xs text-ink-500">
          {r.cautions.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
