import { LEAD_TIME_FALLBACKS } from "./card-fallbacks";
import { applyBp } from "./money";
import { loadShare, type Ledger } from "./ledger";
import { placeExpedited } from "./expedite";
import type { JobPlacement, JobSpec } from "./placement";
import { costLine, totalsOf, type Pricing } from "./pricing";
import { addWorkingDays, nextOpenDay } from "./schedule";
import type { LeadTime, RateCardParams } from "./types";

export { LEAD_TIME_FALLBACKS };

/** Lines worked on extra shifts when expedited: set-up, machining, joining. */
const OVERTIME_LINES = new Set(["setup", "machining", "joining"]);

/** The expedite's charge before margin and tax: the overtime premium on the labour lines and the flat fee. */
export function expeditePremiumCents(pricing: Pick<Pricing, "lines">, card: RateCardParams): number {
  const bp = card.overtimePremiumBp ?? LEAD_TIME_FALLBACKS.overtimePremiumBp;
  const labour = pricing.lines.filter((l) => OVERTIME_LINES.has(l.key)).reduce((a, l) => a + l.amountCents, 0);
  return applyBp(labour, bp) + Math.max(1, card.expediteFeeCents ?? LEAD_TIME_FALLBACKS.expediteFeeCents);
}

/**
 * Standard, expedite and (where the cells have room) economy for a placed job. Standard is the
 * estimate's own date and total. Expedite goes ahead of booked work that keeps its own promise
 * and works set-up, machining and the days after on overtime (`placeExpedited`): never later than
 * standard, and dearer by the overtime premium and fee. Economy lets the bureau fit the job into
 * spare hours: `economyExtraDays` working days later at a discount, offered only when every cell
 * the job uses is booked at most `economyMaxLoadBp` of its working hours from now to that date.
 */
export function leadTimeOptions(ledger: Ledger, spec: JobSpec, standard: JobPlacement, pricing: Pricing, card: RateCardParams): LeadTime[] {
  const out: LeadTime[] = [{ key: "standard", shipDate: standard.shipDate, totalCents: pricing.totalCents, adjustmentCents: 0 }];
  const ex = placeExpedited(ledger, spec, standard);
  const premium = expeditePremiumCents(pricing, card);
  const exTotals = totalsOf([...pricing.lines, costLine("expedite", "Expedited delivery", 1, "order", premium)], card);
  out.push({ key: "expedite", shipDate: ex.shipDate, totalCents: exTotals.totalCents, adjustmentCents: premium, jumped: ex.jumped.length });

  const extra = card.economyExtraDays ?? LEAD_TIME_FALLBACKS.economyExtraDays;
  const doneMs = addWorkingDays(new Date(standard.doneMs), extra, spec.shipCalendar, ledger.plant).getTime();
  const cells = new Map(spec.prints.map((p) => [p.cellKey, p.calendar]));
  const load = Math.max(...[...cells].map(([key, cal]) => loadShare(ledger, key, cal, ledger.nowMs, doneMs)));
  if (load * 10_000 <= (card.economyMaxLoadBp ?? LEAD_TIME_FALLBACKS.economyMaxLoadBp)) {
    const discount = applyBp(pricing.subtotalCents, card.economyDiscountBp ?? LEAD_TIME_FALLBACKS.economyDiscountBp);
    const ecTotals = totalsOf([...pricing.lines, costLine("economy", "Economy delivery", 1, "order", -discount)], card);
    out.push({ key: "economy", shipDate: nextOpenDay(new Date(doneMs), spec.shipCalendar, ledger.plant), totalCents: ecTotals.totalCents, adjustmentCents: -discount });
  }
  return out;
}
