import type { Stage } from "@/db/schema/common";
import { STAGE_LABEL } from "@/lib/labels";

/** Display helpers for the back office (UTC, like the plant calendar). */
export function dateText(v: string | Date | null | undefined): string {
  if (!v) return "—";
  const d = typeof v === "string" ? new Date(v) : v;
  return new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" }).format(d);
}

export function dateTimeText(v: string | Date | null | undefined): string {
  if (!v) return "—";
  const d = typeof v === "string" ? new Date(v) : v;
  return new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", hour: "2-digit", minute: "2-digit", timeZone: "UTC", hour12: false }).format(d) + " UTC";
}

export function hoursText(h: number | null | undefined): string {
  if (h === null || h === undefined || !Number.isFinite(h)) return "—";
  return h >= 48 ? `${(h / 24).toFixed(1)} d` : `${h.toFixed(1)} h`;
}

export function pctText(p: number | null | undefined, signed = false): string {
  if (p === null || p === undefined) return "—";
  return `${signed && p > 0 ? "+" : ""}${p.toFixed(1)} %`;
}

/** A stage by its name in lib/labels.ts. */
export const stageText = (s: Stage | string) => STAGE_LABEL[s as Stage] ?? s.replace(/_/g, " ");
