/**
 * A demo request's quote, and from "accepted" on its order: payments as the processor's webhooks
 * (or a matched bank transfer, or an account invoice) would have left them, and its schedule
 * blocks placed where its stage says.
 */
import { createHash } from "node:crypto";
import { eq } from "drizzle-orm";
import { defaultRateCard } from "@/lib/estimating/defaults";
import type { EstimateResult } from "@/lib/estimating/types";
import { shareOfCents } from "@/lib/money";
import { FLOW } from "@/lib/orders/stages";
import { snapshotOf } from "@/db/queries/addresses";
import * as s from "@/db/schema";
import type { Stage } from "@/db/schema/common";
import { DAY, staffId, type SeedContext, type SeededRequest, type Tx } from "./context";
import { FIRM_TERMS } from "./data";
import { zoneOfFirm } from "./people";
import { processorRecordsFor } from "./processor";

const SALES = "sales@ostrevane.example";

export async function seedQuoteAndOrder(tx: Tx, ctx: SeedContext, q: SeededRequest): Promise<void> {
  const { result, created, reached } = q;
  const issuedAt = new Date(created.getTime() + 1 * DAY);
  const accepted = reached >= FLOW.indexOf("accepted");
  const [quote] = await tx
    .insert(s.quotes)
    .values({
      requestId: q.requestId,
      version: 1,
      status: accepted ? "accepted" : "issued",
      subtotalCents: result.subtotalCents,
      marginBp: defaultRateCard.marginBp,
      marginCents: result.marginCents,
      taxBp: defaultRateCard.taxBp,
      taxCents: result.taxCents,
      totalCents: result.totalCents,
      depositBp: defaultRateCard.depositBp,
      depositCents: result.depositCents,
      validityDays: defaultRateCard.quoteValidityDays,
      terms: "Deposit of half the total on acceptance; balance on shipping. Tool use stays with the client's engineering sign-off.",
      termsVersion: 1,
      shipDate: new Date(result.shipDate),
      rateCardId: ctx.rateCardId,
      createdById: staffId(ctx, SALES),
      issuedById: staffId(ctx, SALES),
      issuedAt,
      validUntil: new Date(issuedAt.getTime() + defaultRateCard.quoteValidityDays * DAY),
      acceptedAt: accepted ? new Date(created.getTime() + 1.5 * DAY) : null,
      acceptedById: accepted ? q.authorId : null,
      createdAt: issuedAt,
    })
    .returning({ id: s.quotes.id });
  await tx.insert(s.quoteLines).values(
    result.lines.map((l, i) => ({
      quoteId: quote!.id,
      partId: q.partId,
      kind: lineKind(l.key),
      description: l.label,
      quantity: l.quantity,
      unitCents: l.unitCents,
      amountCents: l.amountCents,
      estimatedCents: l.amountCents,
      sort: i,
    })),
  );
  if (accepted) await seedOrder(tx, ctx, q, quote!.id);
}

async function seedOrder(tx: Tx, ctx: SeedContext, q: SeededRequest, quoteId: string) {
  const { result, created, reached, n, demo } = q;
  const shipped = reached >= FLOW.indexOf("shipped");
  const scheduled = reached >= FLOW.indexOf("scheduled");
  const onAccount = demo.payment === "account" ? FIRM_TERMS[demo.firm] : undefined;
  const depositCents = onAccount ? 0 : result.depositCents;
  const [order] = await tx
    .insert(s.orders)
    .values({
      requestId: q.requestId,
      orgId: q.orgId,
      quoteId,
      poNumber: onAccount ? `${onAccount.po}-${7100 + n}` : `PO-${demo.firm.slice(0, 3).toUpperCase()}-${4400 + n}`,
      paymentTerms: onAccount?.terms ?? "prepay",
      termsVersion: 1,
      shipTo: snapshotOf(ctx.firms.shipTos.get(demo.firm)!, zoneOfFirm(ctx.firms, demo.firm)),
      totalCents: result.totalCents,
      depositCents,
      balanceCents: result.totalCents - depositCents,
      cellKey: scheduled ? result.cell : null,
      plannedStart: scheduled ? new Date(created.getTime() + 3 * DAY) : null,
      plannedShip: scheduled ? new Date(result.shipDate) : null,
      carrier: shipped ? "Tidewater Freight Lines" : null,
      trackingNumber: shipped ? `TFL${String(880_000 + n * 137)}` : null,
      actualPrintHours: reached >= FLOW.indexOf("cooling") ? round1(result.printHours * 1.08) : null,
      actualMaterialKg: reached >= FLOW.indexOf("cooling") ? round1(result.massKg * 1.04) : null,
      actualMachiningHours: reached >= FLOW.indexOf("inspection") ? round1(result.machiningHours * 0.93) : null,
      inspectionResult: reached >= FLOW.indexOf("finishing") ? "pass" : null,
      createdAt: new Date(created.getTime() + 1.5 * DAY),
    })
    .returning({ id: s.orders.id });
  await seedOrderPayments(tx, ctx, q, order!.id, depositCents, onAccount);
  if (scheduled) {
    const blocks = scheduleFrom(result, printStartFor(q.effective, result, ctx.now));
    await tx.insert(s.scheduleBlocks).values(blocks.map((b) => ({ orderId: order!.id, cellKey: result.cell, ...b })));
  }
}

/** Deposit (card, bank transfer, or none on account) and, once shipped, the balance or the account invoice. */
async function seedOrderPayments(tx: Tx, ctx: SeedContext, q: SeededRequest, orderId: string, depositCents: number, onAccount: (typeof FIRM_TERMS)[keyof typeof FIRM_TERMS]) {
  const { result, created, reached, n, demo, orgId, authorId } = q;
  const paid = reached >= FLOW.indexOf("deposit_paid");
  if (demo.payment === "transfer") {
    // The deposit paid by bank transfer: matched by its reference when it arrived; no card charge at the processor.
    const at = new Date(created.getTime() + 2 * DAY);
    const transferReference = `T${createHash("sha256").update(`transfer-${n}`).digest("hex").slice(0, 9).toUpperCase()}`;
    const [dep] = await tx
      .insert(s.payments)
      .values({
        orderId, orgId, createdById: authorId, kind: "deposit", status: paid ? "paid" : "pending", method: "bank_transfer", amountCents: depositCents,
        receivedCents: paid ? depositCents : 0, transferReference, paymentIntentId: `pi_seed_t${String(n).padStart(3, "0")}`, createdAt: new Date(created.getTime() + 1.5 * DAY), paidAt: paid ? at : null,
        transferDetails: { bankName: "Test Clearing Bank (test mode)", accountHolder: "Ostrevane Additive Works", accountNumber: "480017734210", routingNumber: "110000000", swiftCode: null },
      })
      .returning({ id: s.payments.id });
    if (paid) {
      await tx.insert(s.transferFunds).values({ processorId: `ccsbtxn_seed_${n}`, processorCustomerId: `cus_seed_${demo.firm}`, orgId, paymentId: dep!.id, amountCents: depositCents, reference: transferReference, appliedCents: depositCents, status: "applied", receivedAt: at });
    }
  } else if (!onAccount) {
    const deposit = seedPayment(n, "deposit", result.depositCents, paid, new Date(created.getTime() + 2 * DAY));
    await tx.insert(s.payments).values({ orderId, orgId, createdById: authorId, ...deposit.row });
    if (paid) ctx.processorRecords.push(...processorRecordsFor(deposit.row));
  }
  if (reached < FLOW.indexOf("shipped")) return;
  if (onAccount) {
    // On account: one invoice at shipping for the whole, still open (dated after the loop).
    await tx.insert(s.payments).values({ orderId, orgId, createdById: authorId, kind: "balance", status: "pending", amountCents: result.totalCents, createdAt: new Date(created.getTime() + (reached - 2) * 0.5 * DAY) });
    return;
  }
  const balancePaid = reached >= FLOW.indexOf("delivered");
  const balance = seedPayment(n, "balance", result.totalCents - result.depositCents, balancePaid, new Date(created.getTime() + (reached - 2) * 0.5 * DAY));
  const [balanceRow] = await tx.insert(s.payments).values({ orderId, orgId, createdById: authorId, ...balance.row }).returning({ id: s.payments.id });
  if (balancePaid && demo.refund) {
    // A refund after delivery: the ledger, the processor's record and the credit note agree.
    const at = new Date(created.getTime() + (reached - 1) * 0.5 * DAY);
    const tag = `b${String(n).padStart(3, "0")}`;
    await tx.insert(s.refunds).values({ paymentId: balanceRow!.id, amountCents: demo.refund.cents, reason: demo.refund.reason, status: "succeeded", stripeRefundId: `re_seed_${tag}`, idempotencyKey: `seed-refund-${tag}`, createdById: staffId(ctx, "accounts@ostrevane.example"), createdAt: at });
    await tx.update(s.payments).set({ status: "partially_refunded", refundedCents: demo.refund.cents }).where(eq(s.payments.id, balanceRow!.id));
    ctx.processorRecords.push(...processorRecordsFor({ ...balance.row, status: "paid" }).map((c) => ({ ...c, refundedCents: demo.refund!.cents })));
  } else if (balancePaid) ctx.processorRecords.push(...processorRecordsFor(balance.row));
}

function lineKind(key: string): (typeof s.QUOTE_LINE_KINDS)[number] {
  const k = key.split(/[-_:]/)[0] ?? "";
  if (k === "dwell") return "print";
  return (s.QUOTE_LINE_KINDS as readonly string[]).includes(k) ? (k as (typeof s.QUOTE_LINE_KINDS)[number]) : "other";
}

function round1(v: number) {
  return Math.round(v * 10) / 10;
}

/** A paid or pending payment row as the webhook would have written it. Test-mode fee: 2.9 % + 30¢. */
function seedPayment(n: number, kind: "deposit" | "balance", amountCents: number, paid: boolean, at: Date) {
  const tag = `${kind === "deposit" ? "d" : "b"}${String(n).padStart(3, "0")}`;
  return {
    row: {
      kind,
      status: paid ? ("paid" as const) : ("pending" as const),
      amountCents,
      feeCents: paid ? shareOfCents(amountCents, 290) + 30 : null,
      checkoutSessionId: `cs_test_seed_${tag}`,
      paymentIntentId: paid ? `pi_seed_${tag}` : null,
      chargeId: paid ? `ch_seed_${tag}` : null,
      createdAt: at,
      paidAt: paid ? at : null,
    },
  };
}

/**
 * When the seeded job's print started, so that its blocks sit where its stage says: a scheduled
 * job prints in two days, a printing job is half-way through, later stages lie in the past.
 */
function printStartFor(stage: Stage, result: EstimateResult, now: Date): number {
  const sch = result.schedule;
  const t = (iso: string) => new Date(iso).getTime();
  const from = t(sch.printStart);
  const nowMs = now.getTime();
  const HOUR = 3_600_000;
  switch (stage) {
    case "scheduled":
      return nowMs + 2 * DAY;
    case "printing":
      return nowMs - (t(sch.printEnd) - from) / 2;
    case "cooling":
      return nowMs - (t(sch.printEnd) - from) - HOUR;
    case "machining":
      return nowMs - (t(sch.coolingEnd) - from) - 2 * HOUR;
    case "inspection":
      return nowMs - (t(sch.machiningEnd) - from) - 4 * HOUR;
    default: {
      const later = FLOW.indexOf(stage) - FLOW.indexOf("finishing");
      return nowMs - (t(sch.shipDate) - from) - (1 + 3 * later) * DAY;
    }
  }
}

function scheduleFrom(result: EstimateResult, startMs: number) {
  const sch = result.schedule;
  const base = new Date(sch.printStart).getTime();
  const shift = (iso: string) => new Date(new Date(iso).getTime() - base + startMs);
  return [
    { kind: "print" as const, startsAt: new Date(startMs), endsAt: shift(sch.printEnd) },
    { kind: "cooling" as const, startsAt: shift(sch.printEnd), endsAt: shift(sch.coolingEnd) },
    { kind: "machining" as const, startsAt: shift(sch.coolingEnd), endsAt: shift(sch.machiningEnd) },
    { kind: "finishing" as const, startsAt: shift(sch.machiningEnd), endsAt: shift(sch.shipDate) },
  ];
}
