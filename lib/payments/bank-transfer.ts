import "server-only";
import type Stripe from "stripe";
import type { Db } from "../../db/client";
import { writeAudit } from "../../db/queries/audit";
import { getOrderWithRequest, hasPaid, type PaymentKind } from "../../db/queries/payments";
import { getOpenTransfer, getOrgForProcessor, keepProcessorCustomer, setTransferInstructions, takePaymentForTransfer } from "../../db/queries/transfers";
import type { Payment, TransferDetails } from "../../db/schema";
import { AppError } from "../errors";
import { getStripe } from "./stripe";

export interface TransferInstructionsView {
  paymentId: string;
  reference: string;
  details: TransferDetails;
  amountCents: number;
  receivedCents: number;
  currency: string;
}

const PAYABLE: Record<PaymentKind, readonly string[]> = {
  deposit: ["accepted"],
  balance: ["shipped", "delivered", "closed"],
};

/** The firm's customer record at the processor (bank-transfer account details hang on it), made once. */
export async function ensureProcessorCustomer(db: Db, orgId: string, stripe: Stripe = getStripe()): Promise<string> {
  const org = await getOrgForProcessor(db, orgId);
  if (!org) throw new AppError("not_found:firm", "That firm was not found.");
  if (org.customer) return org.customer;
  const customer = await stripe.customers.create({ name: org.name, email: org.email ?? undefined, metadata: { orgId } }, { idempotencyKey: `customer/${orgId}` });
  // Two requests at once get the same customer (same key); the first write wins, the second is a no-op.
  return keepProcessorCustomer(db, orgId, customer.id);
}

const instructionsOf = (p: Payment): TransferInstructionsView => ({ paymentId: p.id, reference: p.transferReference!, details: p.transferDetails!, amountCents: p.amountCents, receivedCents: p.receivedCents, currency: p.currency });

/**
 * Open a bank transfer for an order's deposit or balance through the processor's bank-transfer
 * method: a PaymentIntent paid from the firm's cash balance, whose instructions (account details
 * and a reference to quote) are kept on our payment. An open transfer for the same payment is
 * reused; a pending payment with no payment page yet becomes the transfer. The caller has checked
 * that the user may see the order.
 */
export async function openBankTransfer(db: Db, input: { orderId: string; kind: PaymentKind; userId: string | null }, stripe: Stripe = getStripe()): Promise<TransferInstructionsView> {
  const row = await getOrderWithRequest(db, input.orderId);
  if (!row) throw new AppError("not_found:order", "That order was not found.");
  const { order, request } = row;
  if (!PAYABLE[input.kind].includes(request.stage)) {
    throw new AppError("conflict:stage", input.kind === "deposit" ? "The deposit is not due: the order is not waiting for it." : "The balance falls due when the order ships.");
  }
  if (await hasPaid(db, order.id, input.kind)) throw new AppError("conflict:paid", `The ${input.kind} is already paid.`);
  const amountCents = input.kind === "deposit" ? order.depositCents : order.balanceCents;
  if (amountCents <= 0) throw new AppError("conflict:amount", `Nothing is due for the ${input.kind}.`);

  const open = await getOpenTransfer(db, order.id, input.kind);
  if (open?.transferReference && open.transferDetails) return instructionsOf(open);

  const customer = await ensureProcessorCustomer(db, order.orgId, stripe);
  const payment =
    open ??
    (await db.transaction((tx) => takePaymentForTransfer(tx, { orderId: order.id, orgId: order.orgId, kind: input.kind, amountCents, currency: order.currency, createdById: input.userId })));

  const intent = await stripe.paymentIntents.create(
    {
      amount: payment.amountCents,
      currency: payment.currency,
      customer,
      allowed_payment_method_types: ["customer_balance"],
      payment_method_data: { type: "customer_balance" },
      payment_method_options: { customer_balance: { funding_type: "bank_transfer", bank_transfer: { type: "us_bank_transfer" } } },
      confirm: true,
      description: `${input.kind === "deposit" ? "Deposit" : "Balance"} for ${request.reference}, PO ${order.poNumber}`,
      metadata: { paymentId: payment.id, orderId: order.id, kind: input.kind },
    },
    { idempotencyKey: `transfer/${payment.id}` },
  );
  const shown = intent.next_action?.display_bank_transfer_instructions;
  const aba = shown?.financial_addresses?.find((a) => a.type === "aba")?.aba;
  if (!shown?.reference || !aba) throw new AppError("unavailable", "The bank-transfer details could not be opened; try again in a moment.");
  const details: TransferDetails = { bankName: aba.bank_name, accountHolder: "Ostrevane Additive Works", accountNumber: aba.account_number, routingNumber: aba.routing_number, swiftCode: null };
  const saved = await db.transaction(async (tx) => {
    const row = await setTransferInstructions(tx, payment.id, { paymentIntentId: intent.id, transferReference: shown.reference!, transferDetails: details });
    await writeAudit(tx, { actorId: input.userId, action: "transfer.opened", entityType: "payment", entityId: payment.id, orgId: order.orgId, after: { kind: input.kind, amountCents: payment.amountCents, reference: shown.reference } });
    return row;
  });
  return instructionsOf(saved);
}
