import type { Stage } from "@/db/schema/common";
import { formatDate, formatDateTime } from "@/lib/dates";
import { STAGE_LABEL } from "@/lib/labels";

/** Display helpers for the back office; dates and times come from lib/dates.ts (the plant's zone). */
export const dateText = (v: string | Date | null | undefined): string => formatDate(v);

export const dateTimeText = (v: string | Date | null | undefined): string => formatDateTime(v);

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
