import { Badge, type BadgeTone } from "@/components/ui/badge";

const TONE: Record<string, BadgeTone> = {
  submitted: "accent", quoted: "info", accepted: "info", deposit_paid: "ok", scheduled: "ok",
  printing: "accent", cooling: "accent", machining: "accent", inspection: "warn", finishing: "accent",
  packed: "neutral", shipped: "ok", delivered: "ok", closed: "neutral", on_hold: "warn", cancelled: "danger",
  issued: "info", draft: "neutral", superseded: "neutral", expired: "warn", declined: "danger",
  paid: "ok", pending: "neutral", failed: "danger", refunded: "warn", partially_refunded: "warn",
};

export function StatusBadge({ value }: { value: string }) {
  return <Badge tone={TONE[value] ?? "neutral"}>{value.replace(/_/g, " ")}</Badge>;
}
