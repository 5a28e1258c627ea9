import type { IssuedDocumentKind } from "@/db/schema/issued-documents";
import { Badge } from "@/components/ui/badge";
import { KIND_TITLES } from "@/lib/documents/numbering";
import { documentUrl } from "@/lib/documents/links";

export interface IssuedDocumentItem {
  id: string;
  kind: IssuedDocumentKind;
  number: string;
  issuedAt: Date;
}

const TONE: Record<IssuedDocumentKind, "neutral" | "accent" | "ok" | "warn"> = {
  quote: "neutral",
  deposit_invoice: "accent",
  invoice: "accent",
  credit_note: "warn",
  packing_list: "ok",
};

const day = (d: Date) => d.toLocaleDateString("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });

/** The numbered PDFs the bureau issued on an order (quotes, invoices, credit notes, packing lists). */
export function IssuedDocumentsList({ docs, empty }: { docs: IssuedDocumentItem[]; empty: string }) {
  if (docs.length === 0) return <p className="text-sm text-ink-500">{empty}</p>;
  return (
    <ul className="divide-y divide-paper-200 text-sm" data-testid="issued-documents">
      {docs.map((d) => (
        <li key={d.id} className="flex flex-wrap items-center gap-x-2 gap-y-1 py-2">
          <Badge tone={TONE[d.kind]}>{KIND_TITLES[d.kind]}</Badge>
          <a href={documentUrl(d.id)} className="font-mono text-kiln-700 underline" target="_blank" rel="noopener">
            {d.number}
          </a>
          <span className="text-xs text-ink-500">{day(d.issuedAt)}</span>
          <a href={`${documentUrl(d.id)}?download=1`} className="ml-auto text-xs text-ink-500 underline">
            PDF<span className="sr-only"> of {KIND_TITLES[d.kind]} {d.number}, download</span>
          </a>
        </li>
      ))}
    </ul>
  );
}
