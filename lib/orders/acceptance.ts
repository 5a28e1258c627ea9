import type { Db } from "../../db/client";
import type { Tx } from "../../db/queries/audit";
import { getBillingAddress, listAddresses } from "../../db/queries/addresses";
import { getCurrentRateCard, getRateCardById } from "../../db/queries/catalogue";
import { listPartsWithAnalysis } from "../../db/queries/parts";
import { getValidExemption } from "../../db/queries/tax-exemptions";
import { listQuoteLines } from "../../db/queries/quotes";
import type { Address, Quote, TaxExemption } from "../../db/schema";
import { zoneFor, type Crate, type FreightRules, type FreightZone } from "../estimating/freight";
import { orderFiguresFor, type OrderFigures } from "../quoting/acceptance";

export interface ShipToOption {
  address: Address;
  zone: FreightZone | null;
  figures: OrderFigures;
}

export interface AcceptanceContext {
  shipTos: ShipToOption[];
  billing: Address | null;
  exemption: TaxExemption | null;
  rules: FreightRules | null;
}

/**
 * What accepting this quote would cost for each of the firm's shipping addresses: freight
 * re-priced from each part's crate for the address's zone (the quote's rate card's table), and no
 * tax when the firm holds a valid exemption. Read by the accept form and, again, by the action.
 */
export async function acceptanceContext(q: Db | Tx, input: { quote: Quote; orgId: string; requestId: string; now: Date }): Promise<AcceptanceContext> {
  const { quote } = input;
  const [addresses, billing, exemption, parts, lines, card] = await Promise.all([
    listAddresses(q, input.orgId, "shipping"),
    getBillingAddress(q, input.orgId),
    getValidExemption(q, input.orgId, input.now),
    listPartsWithAnalysis(q, input.requestId),
    listQuoteLines(q, quote.id),
    quote.rateCardId ? getRateCardById(q as Db, quote.rateCardId) : getCurrentRateCard(q as Db),
  ]);
  const rules = card?.params.freight ?? null;
  const crates = new Map<string, Crate>();
  for (const p of parts) {
    const r = p.analysis?.status === "done" ? p.analysis.result : null;
    if (r?.crate) crates.set(p.part.id, r.crate);
  }
  const rates = { marginBp: quote.marginBp, taxBp: quote.taxBp, depositBp: quote.depositBp };
  const shipTos = addresses.map((address) => {
    const zone = rules ? zoneFor(rules, address.country, address.region) : null;
    return { address, zone, figures: orderFiguresFor({ lines, rates, crates, rules, zone, taxExempt: Boolean(exemption) }) };
  });
  return { shipTos, billing, exemption, rules };
}
