import type { Stage } from "@/db/schema/common";
import { Badge, type BadgeTone } from "@/components/ui/badge";

const TONE: Partial<Record<Stage, BadgeTone>> = {
  draft: "neutral",
  submitted: "info",
  quoted: "accent",
  accepted: "accent",
  deposit_paid: "ok",
  shipped: "ok",
  delivered: "ok",
  closed: "neutral",
  on_hold: "warn",
  cancelled: "danger",
};

export const STAGE_LABEL: Record<Stage, string> = {
  draft: "Draft",
  submitted: "Submitted",
  quoted: "Quote ready",
  accepted: "Accepted, deposit due",
  deposit_paid: "Deposit paid",
  scheduled: "Scheduled",
  printing: "Printing",
  cooling: "Cooling",
  machining: "Machining",
  inspection: "Inspection",
  finishing: "Finishing",
  packed: "Packed",
  shipped: "Shipped",
  delivered: "Delivered",
  closed: "Closed",
  on_hold: "On hold",
  cancelled: "Cancelled",
};

export function StageBadge({ stage }: { stage: Stage }) {
  return <Badge tone={TONE[stage] ?? "info"}>{STAGE_LABEL[stage]}</Badge>;
}
