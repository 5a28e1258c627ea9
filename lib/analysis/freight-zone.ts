import type { Db } from "../../db/client";
import { getDefaultShipTo } from "../../db/queries/addresses";
import { zoneFor } from "../estimating/freight";
import type { RateCardParams } from "../estimating/types";

/**
 * The freight zone an estimate for this firm is priced to: its default ship-to's zone in the
 * rate card's table; null (the card's default zone) when it has no ship-to or the card no table.
 */
export async function firmFreightZone(db: Db, orgId: string | null, card: RateCardParams): Promise<string | null> {
  if (!orgId || !card.freight) return null;
  const shipTo = await getDefaultShipTo(db, orgId);
  return shipTo ? (zoneFor(card.freight, shipTo.country, shipTo.region)?.key ?? null) : null;
}
