import { formatDateTime } from "./dates";
import { AUDIT_FIELD_LABEL } from "./labels";
import { formatCents } from "./money";

/** One changed field of an audit entry, in words a person reads. */
export interface ChangeLine {
  field: string;
  before: string | null;
  after: string | null;
}

const ISO = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/;

/**
 * "amountCents" → "amount", "plannedShip" → "planned ship". The glossary's names (lib/labels.ts)
 * come first; its "(cents)" is dropped, since the value is shown as money here.
 */
function fieldName(key: string): string {
  const named = AUDIT_FIELD_LABEL[key];
  if (named) return named.replace(/ \(cents\)$/, "");
  return key
    .replace(/^stripe/, "processor")
    .replace(/(Cents|Bp)$/, "")
    .replace(/Id$/, "")
    .replace(/([a-z])([A-Z])/g, "$1 $2")
    .replace(/_/g, " ")
    .toLowerCase();
}

/** A stored value as text: cents as money, basis points as percent, instants in the plant's zone, lists counted. */
export function valueText(key: string, v: unknown): string {
  if (v === null || v === undefined || v === "") return "—";
  if (typeof v === "number" && key.endsWith("Cents")) return formatCents(v);
  if (typeof v === "number" && key.endsWith("Bp")) return `${v / 100} %`;
  if (typeof v === "boolean") return v ? "yes" : "no";
  if (typeof v === "string" && ISO.test(v)) return formatDateTime(v);
  if (typeof v === "string") return v.length > 120 ? `${v.slice(0, 117)}…` : v;
  if (typeof v === "number") return String(v);
  if (Array.isArray(v)) return `${v.length} ${v.length === 1 ? "item" : "items"}`;
  return "(details)";
}

/** Keys that are bookkeeping, not something a reader weighs (long ids). */
const HIDDEN = new Set(["id", "key"]);

/**
 * What an audit entry changed, field by field: fields in `after` (and those only in `before`),
 * each with its old and new value as text; unchanged fields are left out when both sides exist.
 */
export function describeChange(before: unknown, after: unknown): ChangeLine[] {
  const b = before && typeof before === "object" && !Array.isArray(before) ? (before as Record<string, unknown>) : null;
  const a = after && typeof after === "object" && !Array.isArray(after) ? (after as Record<string, unknown>) : null;
  if (!a && !b) return after === null || after === undefined ? [] : [{ field: "value", before: null, after: valueText("value", after) }];
  const keys = [...new Set([...Object.keys(a ?? {}), ...Object.keys(b ?? {})])].filter((k) => !HIDDEN.has(k));
  const out: ChangeLine[] = [];
  for (const k of keys) {
    const bv = b ? valueText(k, b[k]) : null;
    const av = a ? valueText(k, a[k]) : null;
    if (b && a && bv === av) continue;
    out.push({ field: fieldName(k), before: b ? bv : null, after: a ? av : null });
  }
  return out;
}
