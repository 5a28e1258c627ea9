import type { Stage } from "@/db/schema/common";

/**
 * The production board's columns, in order. Closed and cancelled orders stay off the board (they
 * are history). Each column shows its nearest work first (planned start, then last change) and at
 * most `BOARD_PAGE` cards at a time; the rest load on asking, so the board stays quick however
 * many orders are open.
 */
export const BOARD_COLUMNS = [
  { key: "waiting", title: "Waiting", stages: ["accepted", "deposit_paid"] },
  { key: "scheduled", title: "Scheduled", stages: ["scheduled"] },
  { key: "on-cell", title: "On the cell", stages: ["printing", "cooling"] },
  { key: "machining", title: "Machining & inspection", stages: ["machining", "inspection"] },
  { key: "finishing", title: "Finishing & packing", stages: ["finishing", "packed"] },
  { key: "shipped", title: "Shipped", stages: ["shipped", "delivered"] },
  { key: "on-hold", title: "On hold", stages: ["on_hold"] },
] as const satisfies readonly { key: string; title: string; stages: readonly Stage[] }[];

export type BoardColumnKey = (typeof BOARD_COLUMNS)[number]["key"];

export const BOARD_PAGE = 20;
export const BOARD_PAGE_MAX = 200;

export function boardColumn(key: string) {
  return BOARD_COLUMNS.find((c) => c.key === key) ?? null;
}
