import { describe, expect, it } from "vitest";
import { defaultRateCard } from "../estimating/defaults";
import { crateFor, freightTo, zoneByKey, type FreightRules } from "../estimating/freight";
import { orderFiguresFor, type AcceptLine } from "./acceptance";
import { quoteTotals } from "./lines";

const rules = defaultRateCard.freight as FreightRules;
const crate = crateFor([2400, 1300, 900], 180, rules);
const z3 = zoneByKey(rules, "zone-3")!;
const z1 = zoneByKey(rules, "zone-1")!;
const quotedFreight = freightTo(crate, z3, rules).perCrateCents;
const lines: AcceptLine[] = [
  { kind: "material", partId: "p1", description: "Material", quantity: 200, unitCents: 1200, amountCents: 240_000, estimatedCents: 240_000 },
  { kind: "freight", partId: "p1", description: "Freight to Zone 3, rest of the mainland", quantity: 2, unitCents: quotedFreight, amountCents: 2 * quotedFreight, estimatedCents: 2 * quotedFreight },
];
const rates = { marginBp: 2500, taxBp: 825, depositBp: 5000 };

describe("orderFiguresFor", () => {
  it("gives the quote's own totals for the zone the quote was priced to, with tax", () => {
    const f = orderFiguresFor({ lines, rates, crates: new Map([["p1", crate]]), rules, zone: z3, taxExempt: false });
    expect(f.isChanged).toBe(false);
    expect(f.totalCents).toBe(quoteTotals(lines, rates).totalCents);
  });
  it("re-prices each crate's freight for a nearer ship-to, and the totals with it", () => {
    const f = orderFiguresFor({ lines, rates, crates: new Map([["p1", crate]]), rules, zone: z1, taxExempt: false });
    const per = freightTo(crate, z1, rules).perCrateCents;
    expect(f.isChanged).toBe(true);
    expect(f.lines[1]).toMatchObject({ description: "Freight to Zone 1, plant region", unitCents: per, amountCents: 2 * per });
    expect(f.freightCents).toBe(2 * per);
    const subtotal = 240_000 + 2 * per;
    const margin = Math.round(subtotal * 0.25);
    const tax = Math.round((subtotal + margin) * 0.0825);
    expect(f).toMatchObject({ subtotalCents: subtotal, marginCents: margin, taxCents: tax, totalCents: subtotal + margin + tax });
    expect(f.depositCents + f.balanceCents).toBe(f.totalCents);
  });
  it("keeps a freight line sales priced by hand, and a part with no crate", () => {
    const edited = lines.map((l) => (l.kind === "freight" ? { ...l, amountCents: 99_900 } : l));
    expect(orderFiguresFor({ lines: edited, rates, crates: new Map([["p1", crate]]), rules, zone: z1, taxExempt: false }).freightCents).toBe(99_900);
    expect(orderFiguresFor({ lines, rates, crates: new Map(), rules, zone: z1, taxExempt: false }).freightCents).toBe(2 * quotedFreight);
  });
  it("charges no tax for an exempt firm", () => {
    const f = orderFiguresFor({ lines, rates, crates: new Map([["p1", crate]]), rules, zone: z3, taxExempt: true });
    expect(f).toMatchObject({ taxBp: 0, taxCents: 0, isChanged: true });
    expect(f.totalCents).toBe(f.subtotalCents + f.marginCents);
  });
  it("keeps a part name's prefix on a multi-part quote", () => {
    const named = lines.map((l) => (l.kind === "freight" ? { ...l, description: "Deck plug: Freight to Zone 3, rest of the mainland" } : l));
    expect(orderFiguresFor({ lines: named, rates, crates: new Map([["p1", crate]]), rules, zone: z1, taxExempt: false }).lines[1]!.description).toBe("Deck plug: Freight to Zone 1, plant region");
  });
});
