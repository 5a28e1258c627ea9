import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Card } from "@/components/ui/card";
import type { SalesRequest } from "@/db/queries/quotes";
import { formatCents } from "@/lib/money";
import { hoursText } from "./format";

type Part = SalesRequest["parts"][number];
const n = (v: unknown) => (typeof v === "number" && Number.isFinite(v) ? v : null);
const mm = (v: unknown) => (n(v) === null ? "—" : `${Math.round(n(v)!).toLocaleString("en-US")} mm`);

/** The automatic analysis beside each part: size, fit, near-net volume, hours, flagged layers, warnings. */
export function AnalysisPanel({ part }: { part: Part }) {
  const a = part.analysis;
  const r = (a?.status === "done" ? a.result : null) as Record<string, unknown> | null;
  const bbox = (r?.bboxMm as number[] | undefined) ?? [];
  const fits = (r?.fits as { cell: string; cellName: string; fits: boolean; marginMm: number }[] | undefined) ?? [];
  const warnings = (r?.warnings as { code: string; message: string }[] | undefined) ?? [];
  const cautions = (r?.cautions as string[] | undefined) ?? [];
  return (
    <Card className="space-y-3">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="font-semibold text-ink-800">{part.name}</h3>
        <span className="text-xs text-ink-500">
          {part.fileName ?? "no file"} · rev {part.revision ?? "—"} · {part.materialKey} · ×{part.quantity} · allowance {part.allowanceMm} mm
        </span>
      </div>
      {!a ? (
        <p className="text-sm text-ink-500">No analysis yet.</p>
      ) : a.status !== "done" ? (
        <Alert tone={a.status === "failed" ? "danger" : "info"} title={a.status === "failed" ? "The analysis failed" : `Analysis ${a.status}`}>
          {a.errorMessage ?? "The estimate appears here when it finishes."}
        </Alert>
      ) : (
        <>
          <p className="text-xs font-medium uppercase tracking-wide text-tide-700">Automatic estimate — not yet a quote</p>
          <dl className="grid grid-cols-2 gap-x-4 gap-y-2 text-sm sm:grid-cols-4">
            <Fig label="Size (x × y × z)" value={bbox.length === 3 ? bbox.map((v) => Math.round(v)).join(" × ") + " mm" : "—"} />
            <Fig label="Near-net volume" value={n(r!.nearNetVolumeMm3) === null ? "—" : `${(n(r!.nearNetVolumeMm3)! / 1e9).toFixed(3)} m³`} />
            <Fig label="Print + dwell" value={`${hoursText(n(r!.printHours))} + ${hoursText(n(r!.dwellHours))}`} />
            <Fig label="Machining" value={hoursText(n(r!.machiningHours))} />
            <Fig label="Deposited mass" value={n(r!.massKg) === null ? "—" : `${n(r!.massKg)!.toFixed(1)} kg`} />
            <Fig label="Layers flagged" value={`${n(r!.flaggedLayers) ?? 0} of ${n(r!.layers) ?? "—"}`} />
            <Fig label="Cell" value={String(r!.cell ?? "—")} />
            <Fig label="Estimate total" value={n(r!.totalCents) === null ? "—" : formatCents(n(r!.totalCents)!)} />
          </dl>
          <div className="flex flex-wrap gap-1">
            {fits.map((f) => (
              <Badge key={f.cell} tone={f.fits ? "ok" : "danger"}>
                {f.cellName}: {f.fits ? `fits, ${mm(f.marginMm)} spare` : `too big by ${mm(-f.marginMm)}`}
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

function Fig({ label, value }: { label: string; value: string }) {
  return (
    <div>
      <dt className="text-xs text-ink-500">{label}</dt>
      <dd className="figures font-medium text-ink-800">{value}</dd>
    </div>
  );
}
