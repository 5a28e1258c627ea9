import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { analyse } from "../estimating/analyse";
import { defaultCells, defaultMaterials, defaultRateCard } from "../estimating/defaults";
import { partSchema, partToRow } from "../validation/request";
import { analysisOptionsFor } from "./options";

const part = {
  units: "mm" as const, unitsConfirmed: true, materialKey: "abs-cf", allowanceMm: 6.35, quantity: 1,
  printMode: "solid" as const, shellWalls: 2, cellKey: null,
};
const request = { cureTempC: null, partCtePpmPerK: null };

describe("body choice of a CAD assembly", () => {
  it("is stored sorted and without repeats; none chosen means every body", () => {
    const base = { id: "p", name: "Assembly", materialKey: "abs-cf", allowance: 6.35, quantity: 1, printMode: "solid", units: "mm", unitsConfirmed: true };
    expect(partToRow(partSchema.parse({ ...base, bodies: [5, 1, 5, 3] })).selectedBodies).toEqual([1, 3, 5]);
    expect(partToRow(partSchema.parse({ ...base, bodies: [] })).selectedBodies).toBeNull();
    expect(partToRow(partSchema.parse(base)).selectedBodies).toBeNull();
    expect(partSchema.safeParse({ ...base, bodies: [-1] }).success).toBe(false);
    expect(partSchema.safeParse({ ...base, bodies: [1.5] }).success).toBe(false);
  });

  it("reaches the engine, which prints only the chosen bodies", async () => {
    expect(analysisOptionsFor({ ...part, selectedBodies: [0, 2] }, request).bodies).toEqual([0, 2]);
    expect(analysisOptionsFor({ ...part, selectedBodies: null }, request)).not.toHaveProperty("bodies");

    // as1-oc-214.stp: CAx Implementor Forum assembly AS1 (18 bodies), from the occt-import-js test files.
    const bytes = new Uint8Array(readFileSync(path.resolve(import.meta.dirname, "../../mocks/fixtures/cad/as1-oc-214.stp")));
    const catalogue = { materials: defaultMaterials, cells: defaultCells, rateCard: defaultRateCard };
    const now = new Date("2026-12-01T12:00:00Z");
    const all = await analyse({ bytes, fileName: "as1.stp", options: analysisOptionsFor(part, request), catalogue, now });
    const two = await analyse({ bytes, fileName: "as1.stp", options: analysisOptionsFor({ ...part, selectedBodies: [0, 1] }, request), catalogue, now });
    expect(all.cad?.bodies).toHaveLength(18);
    expect(two.cad?.bodies.filter((b) => b.isKept).map((b) => b.index)).toEqual([0, 1]);
    expect(two.volumeMm3).toBeLessThan(all.volumeMm3);
    expect(two.triangles).toBeLessThan(all.triangles);
  }, 60_000);
});
