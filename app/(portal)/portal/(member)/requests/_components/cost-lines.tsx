import { formatCents } from "@/lib/money";

export interface CostLineRow {
  key: string;
  label: string;
  /** Shown as given (e.g. "6.41 kg"). */
  quantity: string;
  amountCents: number;
}

export interface CostTotalRow {
  label: string;
  cents: number;
  tone?: "total" | "muted";
}

/** The cost lines of an estimate or a quote as the client sees them (the bureau's margin inside the lines), with tax and totals under them. */
export function CostLines({
  heading,
  caption,
  lines,
  totals,
  currency,
}: {
  heading: string;
  caption?: string;
  lines: CostLineRow[];
  totals: CostTotalRow[];
  currency?: string;
}) {
  return (
    <div tabIndex={0} className="focus-visible:outline-2 focus-visible:outline-ink-600 overflow-x-auto">
      <table className="min-w-full text-sm">
        {caption ? <caption className="sr-only">{caption}</caption> : null}
        <thead className="text-left text-xs uppercase tracking-wide text-ink-500">
          <tr>
            <th className="py-1 pr-3">{heading}</th>
            <th className="py-1 pr-3 text-right">Qty</th>
            <th className="py-1 text-right">Amount</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-paper-200">
          {lines.map((l) => (
            <tr key={l.key}>
              <td className="py-1.5 pr-3">{l.label}</td>
              <td className="figures py-1.5 pr-3 text-right text-ink-500">{l.quantity}</td>
              <td className="figures py-1.5 text-right">{formatCents(l.amountCents, currency)}</td>
            </tr>
          ))}
        </tbody>
        <tfoot className="text-sm">
          {totals.map((t, i) => (
            <tr key={t.label} className={t.tone === "total" ? "font-semibold" : t.tone === "muted" ? "text-ink-500" : undefined}>
              <td colSpan={2} className={i === 0 ? "pt-2" : undefined}>
                {t.label}
              </td>
              <td className={`figures text-right${i === 0 ? " pt-2" : ""}`}>{formatCents(t.cents, currency)}</td>
            </tr>
          ))}
        </tfoot>
      </table>
    </div>
  );
}

/**
 * A quantity a client is shown: material and parts as counted; machine and labour hours are the
 * bureau's own planning figures, so those lines show no quantity.
 */
export function clientQuantity(quantity: number, unit?: string): string {
  return unit === "h" ? "" : lineQuantity(quantity, unit);
}

/** Quantities as the line tables show them: at most two decimals. */
export function lineQuantity(quantity: number, unit?: string): string {
  const q = String(Math.round(quantity * 100) / 100);
  return unit ? `${q} ${unit}` : q;
}
