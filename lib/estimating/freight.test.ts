import { describe, expect, it } from "vitest";
import { defaultRateCard } from "./defaults";
import { crateFor, freightTo, needsFlatbed, zoneByKey, zoneFor, type FreightRules } from "./freight";
import { price } from "./pricing";

const rules = defaultRateCard.freight as FreightRules;
const van = rules.closedTrailer;

describe("needsFlatbed", () => {
  // The closed trailer's inside: 15.9 m × 2.49 m × 2.69 m, about 20 t (common practice, from memory).
  it.each([
    { size: [3000, 1500, 800], kg: 600, flatbed: false, why: "a small crate" },
    { size: [800, 3000, 1500], kg: 600, flatbed: false, why: "any face down: the smallest side goes up" },
    { size: [12_000, 2_400, 2_600], kg: 5_000, flatbed: false, why: "long but inside every limit" },
    { size: [12_000, 2_800, 2_800], kg: 5_000, flatbed: true, why: "wider than the trailer whichever face is down" },
    { size: [16_500, 1_000, 1_000], kg: 2_000, flatbed: true, why: "longer than the trailer" },
    { size: [2_000, 2_000, 2_000], kg: 21_000, flatbed: true, why: "over the payload" },
  ])("$why", ({ size, kg, flatbed }) => {
    expect(needsFlatbed(size, kg, van)).toBe(flatbed);
  });
});

describe("zoneFor", () => {
  it("takes the subdivision before the country, the country before the catch-all", () => {
    expect(zoneFor(rules, "US", "TX")?.key).toBe("zone-1");
    expect(zoneFor(rules, "us", " ak ")?.key).toBe("zone-4");
    expect(zoneFor(rules, "US", "VT")?.key).toBe("zone-3");
    expect(zoneFor(rules, "CA", "ON")?.key).toBe("zone-4");
    expect(zoneFor(rules, "NO", null)?.key).toBe("zone-5");
  });
  it("is null when a table without a catch-all has no match", () => {
    expect(zoneFor({ ...rules, zones: rules.zones.filter((z) => !z.regions.includes("*")) }, "NO", null)).toBeNull();
  });
  it("falls back to the default zone for an unknown key", () => {
    expect(zoneByKey(rules, "gone")?.key).toBe(rules.defaultZoneKey);
    expect(zoneByKey(rules, "zone-1")?.key).toBe("zone-1");
  });
});

describe("freightTo", () => {
  const zone = { key: "z", name: "Z", regions: ["*"], baseCents: 10_000, centsPerKg: 100, flatbedSurchargeCents: 50_000, transitDays: 3 };
  it("bills the gross mass of a dense crate: base + rate × kg", () => {
    // 1 m × 1 m × 0.5 m = 0.5 m³ → 166.5 kg dimensional; 400 kg gross is more.
    const crate = crateFor([1000, 1000, 500], 377.5, rules);
    expect(crate.grossKg).toBe(400); // 377.5 + 45 kg/m³ × 0.5 m³
    const f = freightTo(crate, zone, rules);
    expect(f.billableKg).toBe(400);
    expect(f.perCrateCents).toBe(10_000 + 100 * 400);
  });
  it("bills the dimensional mass of a light, bulky crate", () => {
    // 4 m × 2 m × 1 m = 8 m³ → 2664 kg at 333 kg/m³, far above 300 + 360 kg gross.
    const f = freightTo(crateFor([4000, 2000, 1000], 300, rules), zone, rules);
    expect(f.billableKg).toBe(2664);
    expect(f.perCrateCents).toBe(10_000 + 266_400);
  });
  it("adds the flatbed surcharge to an oversize crate", () => {
    const crate = crateFor([9000, 3000, 1200], 900, rules);
    expect(crate.needsFlatbed).toBe(true);
    const f = freightTo(crate, zone, rules);
    expect(f.flatbed).toBe(true);
    expect(f.perCrateCents).toBe(10_000 + 100 * f.billableKg + 50_000);
  });
});

describe("price() with a zone table", () => {
  const input = {
    quantity: 2, massKg: 100, materialPricePerKgCents: 1000, printHours: 10, dwellHours: 0, machiningHours: 5, netAreaMm2: 1e6,
    crateSizeMm: [2000, 1000, 800] as [number, number, number], partMassKg: 80, options: {},
  };
  it("prices the freight line for the zone asked, per crate", () => {
    const near = price({ ...input, freightZone: "zone-1" }, defaultRateCard);
    const far = price({ ...input, freightZone: "zone-4" }, defaultRateCard);
    const line = (p: typeof near) => p.lines.find((l) => l.key === "freight")!;
    expect(line(near).label).toBe("Freight to Zone 1, plant region");
    expect(line(near).quantity).toBe(2);
    expect(line(near).unitCents).toBe(near.crate!.freight.perCrateCents);
    // 1.6 m³ → 532.8 kg dimensional beats 80 + 72 kg gross.
    expect(near.crate!.freight.billableKg).toBe(532.8);
    expect(line(near).unitCents).toBe(30_000 + Math.round(95 * 532.8));
    expect(line(far).unitCents).toBe(90_000 + Math.round(260 * 532.8));
    expect(far.totalCents - near.totalCents).toBeGreaterThan(0);
  });
  it("uses the default zone with no destination, and the flat rate on a card without a table", () => {
    expect(price(input, defaultRateCard).crate!.freight.zoneKey).toBe("zone-3");
    const { freight: _drop, ...old } = defaultRateCard;
    const p = price(input, old);
    expect(p.crate).toBeUndefined();
    expect(p.lines.find((l) => l.key === "freight")!.unitCents).toBe(40_000 + 120 * 80);
  });
});
