import type { Stage } from "@/db/schema/common";
import { Badge } from "@/components/ui/badge";
import {
  PAYMENT_STATE_LABEL,
  PAYMENT_STATE_TONE,
  QUOTE_STATE_LABEL,
  QUOTE_STATE_TONE,
  REFUND_STATE_LABEL,
  REFUND_STATE_TONE,
  STAGE_LABEL,
  STAGE_TONE,
  type PaymentState,
  type QuoteState,
  type RefundState,
} from "@/lib/labels";

/** The order's stage: one name and one colour per stage, on staff and client screens alike. */
/** `onAccount`: an order on net terms has no deposit; its "deposit paid" stage reads "Accepted on account". */
export function StageBadge({ stage, heldFrom, onAccount = false }: { stage: Stage; heldFrom?: Stage | null; onAccount?: boolean }) {
  return (
    <Badge tone={STAGE_TONE[stage]}>
      {onAccount && stage === "deposit_paid" ? "Accepted on account" : STAGE_LABEL[stage]}
      {stage === "on_hold" && heldFrom ? ` (from ${STAGE_LABEL[heldFrom].toLowerCase()})` : ""}
    </Badge>
  );
}

export function PaymentStateBadge({ state }: { state: PaymentState }) {
  return <Badge tone={PAYMENT_STATE_TONE[state]}>{PAYMENT_STATE_LABEL[state]}</Badge>;
}

export function RefundStateBadge({ state }: { state: RefundState }) {
  return <Badge tone={REFUND_STATE_TONE[state]}>{REFUND_STATE_LABEL[state]}</Badge>;
}

export function QuoteStateBadge({ state }: { state: QuoteState }) {
  return <Badge tone={QUOTE_STATE_TONE[state]}>{QUOTE_STATE_LABEL[state]}</Badge>;
}
