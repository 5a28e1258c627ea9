import { crateFor, freightTo, zoneByKey, type Crate, type FreightQuote } from "./freight";
import { applyBp, roundCents } from "./money";
import type { CostLine, RateCardParams } from "./types";

export interface PricingInput {
  quantity: number;
  massKg: number;
  materialPricePerKgCents: number;
  printHours: number;
  /** The cell's hourly print rate; the rate card's when absent. */
  printRateCentsPerH?: number;
  dwellHours: number;
  machiningHours: number;
  netAreaMm2: number;
  /** Crate outside size, mm. */
  crateSizeMm: [number, number, number];
  partMassKg: number;
  options: { sealingCoat?: boolean; vacuumTest?: boolean };
  /** Destination zone key (the firm's default ship-to); the card's default zone when absent. */
  freightZone?: string | null;
}

export interface Pricing {
  lines: CostLine[];
  subtotalCents: number;
  marginCents: number;
  taxCents: number;
  totalCents: number;
  depositCents: number;
  balanceCents: number;
  /** The crate and the freight it was priced with; absent on a card with no zone table. */
  crate?: Crate & { freight: FreightQuote };
}

function line(key: string, label: string, quantity: number, unit: string, unitCents: number): CostLine {
  return { key, label, quantity: Math.round(quantity * 1000) / 1000, unit, unitCents, amountCents: roundCents(quantity * unitCents) };
}

/**
 * Cost lines from the rate card, each rounded once to cents by `roundCents`; margin on the
 * subtotal, tax on subtotal + margin, deposit share of the total, all in basis points.
 * Per-part lines are multiplied by the quantity; engineering and setup are charged once.
 */
export function price(inp: PricingInput, card: RateCardParams): Pricing {
  const q = Math.max(1, Math.floor(inp.quantity));
  const crateM3 = (inp.crateSizeMm[0] * inp.crateSizeMm[1] * inp.crateSizeMm[2]) / 1e9;
  const lines: CostLine[] = [
    line("material", "Material (deposited, purge and start-up scrap)", inp.massKg * q, "kg", inp.materialPricePerKgCents),
    line("print", "Printing cell time", inp.printHours * q, "h", inp.printRateCentsPerH ?? card.printRateCentsPerH),
    line("dwell", "Cooling dwell between layers", inp.dwellHours * q, "h", card.dwellRateCentsPerH),
    line("machining", "CNC machining to net shape", inp.machiningHours * q, "h", card.machiningRateCentsPerH),
    line("engineering", "Engineering and build planning", card.engineeringHoursPerPart, "h", card.engineeringRateCentsPerH),
    line("setup", "Setup", 1, "order", card.setupFeeCents),
  ];
  if (inp.options.sealingCoat) lines.push(line("sealing", "Sealing coat", (inp.netAreaMm2 / 1e6) * q, "m²", card.sealingCoatCentsPerM2));
  if (inp.options.vacuumTest) lines.push(line("vacuum-test", "Vacuum-integrity test", q, "part", card.vacuumTestCents));
  const crate = roundCents(card.crateBaseCents + card.crateCentsPerKg * inp.partMassKg + card.crateCentsPerM3 * crateM3);
  lines.push(line("crating", "Crating", q, "crate", crate));
  const zone = card.freight ? zoneByKey(card.freight, inp.freightZone) : null;
  let crateOut: Pricing["crate"];
  if (card.freight && zone) {
    const crate = crateFor(inp.crateSizeMm, inp.partMassKg, card.freight);
    const fq = freightTo(crate, zone, card.freight);
    crateOut = { ...crate, freight: fq };
    lines.push(line("freight", `Freight to ${zone.name}${fq.flatbed ? " (flatbed, oversize)" : ""}`, q, "crate", fq.perCrateCents));
  } else {
    const freight = roundCents(card.freightBaseCents + card.freightCentsPerKg * inp.partMassKg);
    lines.push(line("freight", "Freight", q, "crate", freight));
  }
  return { ...totalsOf(lines, card), ...(crateOut ? { crate: crateOut } : {}) };
}

/** Subtotal of the lines, margin on it, tax on subtotal + margin, deposit share of the total (basis points). */
export function totalsOf(lines: CostLine[], card: RateCardParams): Pricing {
  const subtotalCents = lines.reduce((s, l) => s + l.amountCents, 0);
  const marginCents = applyBp(subtotalCents, card.marginBp);
  const taxCents = applyBp(subtotalCents + marginCents, card.taxBp);
  const totalCents = subtotalCents + marginCents + taxCents;
  const depositCents = applyBp(totalCents, card.depositBp);
  return { lines, subtotalCents, marginCents, taxCents, totalCents, depositCents, balanceCents: totalCents - depositCents };
}

/** A cost line, its amount rounded once to cents. */
export function costLine(key: string, label: string, quantity: number, unit: string, unitCents: number): CostLine {
  return line(key, label, quantity, unit, unitCents);
}
