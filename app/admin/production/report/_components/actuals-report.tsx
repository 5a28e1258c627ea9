"use client";

import { EmptyState, Skeleton } from "@/components/ui/card";
import { pctText } from "@/components/admin/format";
import { useApi } from "@/components/admin/use-api";
import type { ActualsAnswer as Answer } from "@/lib/contracts/production";


const err = (est: number, act: number | null) => (act === null || est <= 0 ? null : ((act - est) / est) * 100);
const f1 = (v: number | null) => (v === null ? "—" : v.toFixed(1));

/** Actual against estimate: per order, and per material the mean and spread of the error. */
export function ActualsReport() {
  const { data, error, isLoading } = useApi<Answer>("/api/admin/reports/actuals");
  if (error) return <p role="alert" className="text-sm text-signal-danger">{error}</p>;
  if (isLoading && !data) return <Skeleton className="h-48" />;
  if (!data || data.perOrder.length === 0) return <EmptyState title="No actuals recorded yet">Record print hours, kilograms and machining hours on an order to compare them here.</EmptyState>;
  return (
    <div className="space-y-6">
      <div tabIndex={0} className="focus-visible:outline-2 focus-visible:outline-ink-600 overflow-x-auto rounded-md bg-white ring-1 ring-paper-200">
        <table className="min-w-full text-sm" aria-label="Error per material">
          <thead className="bg-paper-100 text-left text-xs uppercase tracking-wide text-ink-500">
            <tr><th className="px-4 py-2">Material</th><th className="px-4 py-2">Print time error</th><th className="px-4 py-2">Mass error</th><th className="px-4 py-2">Machining error</th></tr>
          </thead>
          <tbody className="divide-y divide-paper-200">
            {data.perMaterial.map((m) => (
              <tr key={m.material}>
                <td className="px-4 py-2 font-medium">{m.material}</td>
                {[m.print, m.kg, m.machining].map((s, i) => (
                  <td key={i} className="figures px-4 py-2">{s.count ? `${pctText(s.meanPct, true)} ± ${pctText(s.spreadPct)} (n=${s.count})` : "—"}</td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div tabIndex={0} className="focus-visible:outline-2 focus-visible:outline-ink-600 overflow-x-auto rounded-md bg-white ring-1 ring-paper-200">
        <table className="min-w-full text-sm" aria-label="Actual against estimate per order">
          <thead className="bg-paper-100 text-left text-xs uppercase tracking-wide text-ink-500">
            <tr><th className="px-4 py-2">Order</th><th className="px-4 py-2">Material</th><th className="px-4 py-2">Print h (est → act)</th><th className="px-4 py-2">kg (est → act)</th><th className="px-4 py-2">Machining h (est → act)</th></tr>
          </thead>
          <tbody className="divide-y divide-paper-200">
            {data.perOrder.map((o) => (
              <tr key={o.orderId}>
                <td className="px-4 py-2">{o.reference}<span className="block text-xs text-ink-500">{o.projectName}</span></td>
                <td className="px-4 py-2">{o.material}</td>
                <td className="figures px-4 py-2">{f1(o.estimate.printHours)} → {f1(o.actualPrintHours)} <span className="text-xs text-ink-500">{pctText(err(o.estimate.printHours, o.actualPrintHours), true)}</span></td>
                <td className="figures px-4 py-2">{f1(o.estimate.massKg)} → {f1(o.actualMaterialKg)} <span className="text-xs text-ink-500">{pctText(err(o.estimate.massKg, o.actualMaterialKg), true)}</span></td>
                <td className="figures px-4 py-2">{f1(o.estimate.machiningHours)} → {f1(o.actualMachiningHours)} <span className="text-xs text-ink-500">{pctText(err(o.estimate.machiningHours, o.actualMachiningHours), true)}</span></td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="text-xs text-ink-500">Error = (actual − estimate) / estimate; spread is the sample standard deviation over the orders of that material.</p>
    </div>
  );
}
