import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Card } from "@/components/ui/card";
import type { SalesRequest } from "@/db/queries/sales-requests";
import { formatCents } from "@/lib/money";
import { hoursText } from "@/components/admin/format";
import { RetryAnalysisButton } from "./retry-analysis-button";
import { BuildDetails, buildModeText } from "@/components/estimate/build-details";

type Part = SalesRequest["parts"][number];
const n = (v: unknown) =>
  typeof v === "number" && Number.isFinite(v) ? v : null;
const mm = (v: unknown) =>
  n(v) === null ? "—" : `${Math.round(n(v)!).toLocaleString("en-US")} mm`;

/** The automatic analysis beside each part: size, fit, near-net volume, hours, flagged layers, warnings. */
export function AnalysisPanel({ part, materialName }: { part: Part; materialName?: string }) {
  const a = part.analysis;
  const r = a?.status === "done" ? a.result : null;
  const bbox = r?.bboxMm ?? [];
  const fits = r?.fits ?? [];
  const warnings = r?.warnings ?? [];
  const cautions = r?.cautions ?? [];
  const status = r?.status ?? "priced";
  const reasons = r?.reviewReasons ?? [];
  const alternatives = r?.alternatives ?? [];
  const remedies = r?.remedies ?? [];
  const shell = r?.shell ?? null;
  const sched: Partial<NonNullable<typeof r>["schedule"]> = r?.schedule ?? {};
  const cellName = fits.find((f) => f.cell === r?.cell)?.cellName ?? String(r?.cell ?? "—");
  return (
    <Card className="space-y-3">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="font-semibold text-ink-800">{part.name}</h3>
        <span className="text-xs text-ink-500">
          {part.fileName ?? "no file"} · rev {part.revision ?? "—"} ·{" "}
          {materialName ?? r?.material.name ?? part.materialKey} · ×{part.quantity} · allowance {part.allowanceMm}{" "}
          mm
        </span>
      </div>
      {!a ? (
        <p className="text-sm text-ink-500">No analysis yet.</p>
      ) : a.status !== "done" ? (
        <Alert
          tone={a.status === "failed" ? "danger" : "info"}
          title={
            a.status === "failed"
              ? "The analysis failed"
              : `Analysis ${a.status}`
          }
        >
          {a.errorMessage ?? "The estimate appears here when it finishes."}
          {a.status === "failed" ? <RetryAnalysisButton analysisId={a.id} /> : null}
        </Alert>
      ) : (
        <>
          <div className="flex flex-wrap items-center gap-2">
            <p className="text-xs font-medium uppercase tracking-wide text-tide-700">
              Automatic estimate — not yet a quote
            </p>
            {status === "needs-review" ? (
              <Badge tone="warn">Needs engineer review</Badge>
            ) : (
              <Badge tone="ok">Printable plan</Badge>
            )}
          </div>
          {status === "needs-review" ? (
            <div data-testid="analysis-review">
              <Alert
                tone="warn"
                title="Needs review: the client sees no price; the figures below are indicative"
              >
                <ul className="list-disc pl-4">
                  {reasons.map((x) => (
                    <li key={x.code}>{x.message}</li>
                  ))}
                </ul>
              </Alert>
            </div>
          ) : null}
          <dl className="grid grid-cols-2 gap-x-4 gap-y-2 text-sm sm:grid-cols-4">
            <Fig
              label="Size (x × y × z)"
              value={
                bbox.length === 3
                  ? bbox.map((v) => Math.round(v)).join(" × ") + " mm"
                  : "—"
              }
            />
            <Fig
              label="Near-net volume"
              value={
                n(r!.nearNetVolumeMm3) === null
                  ? "—"
                  : `${(n(r!.nearNetVolumeMm3)! / 1e9).toFixed(3)} m³`
              }
            />
            <Fig
              label="Print + dwell"
              value={`${hoursText(n(r!.printHours))} + ${hoursText(n(r!.dwellHours))}`}
            />
            <Fig label="Machining" value={hoursText(n(r!.machiningHours))} />
            <Fig
              label="Deposited mass"
              value={
                n(r!.massKg) === null ? "—" : `${n(r!.massKg)!.toFixed(1)} kg`
              }
            />
            <Fig
              label="Layers flagged"
              value={`${n(r!.flaggedLayers) ?? 0} of ${n(r!.layers) ?? "—"}`}
            />
            <Fig
              label="Cell"
              value={`${cellName}${n(r!.printRateCentsPerH) ? ` at ${formatCents(n(r!.printRateCentsPerH)!)}/h` : ""}`}
            />
            <Fig
              label="Estimate total"
              value={
                n(r!.totalCents) === null ? "—" : formatCents(n(r!.totalCents)!)
              }
            />
          </dl>
          <p className="text-sm text-ink-700" data-testid="analysis-build">
            {typeof r!.printMode === "string" && r!.printMode.startsWith("vertical-") ? `${buildModeText(r!.printMode)}. ` : ""}
            {r!.printMode === "solid" || r!.printMode === "vertical-solid" || (!shell && r!.printMode === undefined)
              ? "Solid print"
              : shell
                ? `Shell: ${shell.walls} walls (${shell.wallThicknessMm} mm${shell.wallsFromAllowance ? ", from the allowance" : ", set by hand"}), ribs every ${shell.ribSpacingMm} mm, ${shell.skinLayers}-layer skins, tops ${shell.bridging === "direct" ? "bridged directly" : "on support ribs"}`
                : "Shell"}
            {` · bead ${String(r!.beadWidthMm ?? "—")} mm × layer ${String(r!.layerHeightMm ?? "—")} mm · ${String(r!.meanSpeedMmS ?? r!.speedMmS ?? "—")} mm/s mean`}
          </p>
          {sched.printStart ? (
            <p className="text-sm text-ink-600" data-testid="analysis-schedule">
              Set-up from {stamp(sched.setupStart)}; printing runs straight
              through {stamp(sched.printStart)} → {stamp(sched.printEnd)};
              machined by {stamp(sched.machiningEnd)} ({sched.timeZone ?? "UTC"}{" "}
              shifts)
            </p>
          ) : null}
          <BuildDetails r={r!} priceWithheld={false} staff />
          {alternatives.length ? (
            <div tabIndex={0} className="focus-visible:outline-2 focus-visible:outline-ink-600 overflow-x-auto">
              <table
                className="w-full text-left text-sm"
                data-testid="analysis-alternatives"
              >
                <caption className="sr-only">Best plan on each cell</caption>
                <thead className="text-xs text-ink-500">
                  <tr>
                    <th className="py-1 pr-3 font-medium">Cell</th>
                    <th className="py-1 pr-3 font-medium">Bead × layer</th>
                    <th className="py-1 pr-3 text-right font-medium">Hours</th>
                    <th className="py-1 pr-3 text-right font-medium">Total</th>
                    <th className="py-1 pr-3 font-medium">Ships</th>
                    <th className="py-1 font-medium">Why not</th>
                  </tr>
                </thead>
                <tbody className="divide-y divide-paper-200">
                  {alternatives.map((a) => (
                    <tr key={a.cell}>
                      <td className="py-1 pr-3">{a.cellName}</td>
                      <td className="figures py-1 pr-3">
                        {a.beadWidthMm} × {a.layerHeightMm} mm
                      </td>
                      <td className="figures py-1 pr-3 text-right">
                        {hoursText(a.printHours + a.dwellHours)}
                      </td>
                      <td className="figures py-1 pr-3 text-right">
                        {formatCents(a.totalCents)}
                      </td>
                      <td className="figures py-1 pr-3">{a.shipDate}</td>
                      <td className="py-1 text-ink-600">
                        {a.whyNot || "chosen"}
                        {a.status === "needs-review" && a.whyNot ? "" : ""}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          ) : null}
          {remedies.length ? (
            <details className="text-sm text-ink-600">
              <summary className="cursor-pointer">
                What the planner tried ({remedies.length})
              </summary>
              <ul className="mt-1 list-disc pl-5">
                {remedies.map((x) => (
                  <li key={x.code + x.tried}>
                    {x.tried} → {x.result}
                  </li>
                ))}
              </ul>
            </details>
          ) : null}
          <div className="flex flex-wrap gap-1">
            {fits.map((f) => (
              <Badge key={f.cell} tone={f.fits ? "ok" : "danger"}>
                {f.cellName}:{" "}
                {f.fits
                  ? `fits, ${mm(f.marginMm)} spare`
                  : `too big by ${mm(-f.marginMm)}`}
              </Badge>
            ))}
          </div>
          {warnings.length ? (
            <Alert tone="warn" title="Material and process warnings">
              <ul className="list-disc pl-4">
                {warnings.map((w) => (
                  <li key={w.code + w.message}>{w.message}</li>
                ))}
              </ul>
            </Alert>
          ) : null}
          {cautions.length ? (
            <Alert tone="info" title="Cautions">
              <ul className="list-disc pl-4">
                {cautions.map((c) => (
                  <li key={c}>{c}</li>
                ))}
              </ul>
            </Alert>
          ) : null}
        </>
      )}
    </Card>
  );
}

function stamp(iso: string | undefined): string {
  return iso ? `${iso.slice(0, 16).replace("T", " ")} UTC` : "—";
}

function Fig({ label, value }: { label: string; value: string }) {
  return (
    <div>
      <dt className="text-xs text-ink-500">{label}</dt>
      <dd className="figures font-medium text-ink-800">{value}</dd>
    </div>
  );
}
