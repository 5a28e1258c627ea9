import { describe, expect, it } from "vitest";
import { binaryStl, box } from "../../mocks/fixtures/meshes";
import { analyse, type AnalyseOptions } from "./analyse";
import { defaultCells, defaultMaterials, defaultRateCard } from "./defaults";
import { fitCells, verticalCellOf, verticalFit } from "./orient";

const catalogue = { cells: defaultCells, materials: defaultMaterials, rateCard: defaultRateCard };
const now = new Date("2027-03-01T09:00:00Z");
const run = (size: [number, number, number], options: AnalyseOptions = {}) => analyse({ bytes: binaryStl(box(...size)), fileName: "part.stl", options, catalogue, now });
const longAxis = defaultCells.find((c) => c.key === "long-axis")!;

describe("vertical printing of long parts", () => {
  it("the flagship cell stacks vertical layers along its 12 m long axis inside its cross travel", () => {
    expect(verticalCellOf(longAxis)!.envelopeMm).toEqual({ x: 3000, y: 2400, z: 12_000 });
    expect(verticalCellOf(defaultCells.find((c) => c.key === "long-bed")!)).toBeNull();
    // an 11 m beam, grown by 6.35 mm a side: its length along the long axis, 987.3 mm to spare
    const v = verticalFit([11_012.7, 412.7, 312.7], longAxis)!;
    expect(v.orientation.up).toBe("x");
    expect(v.heightMm).toBeCloseTo(11_012.7, 6);
    expect(v.marginMm).toBeCloseTo(987.3, 6);
    // a horizontal fit is reported as before; only a part that fits no bed lying down reports vertical
    const f = fitCells([11_012.7, 412.7, 312.7], defaultCells, v.orientation, { cell: "long-axis" });
    expect(f.find((x) => x.cell === "long-axis")).toMatchObject({ fits: true, vertical: true, fitsChosen: true });
    expect(f.find((x) => x.cell === "long-bed")!.fits).toBe(false);
  });

  it("an 11 m beam prints on the flagship cell without a split, its layers across its length", async () => {
    const r = await run([11_000, 400, 300]);
    expect(r.fitsAny).toBe(true);
    expect(r.split).toBeNull();
    expect(r.cell).toBe("long-axis");
    expect(r.printMode).toBe("vertical-shell");
    expect(r.orientation.up).toBe("x");
    expect(r.status).toBe("priced");
    expect(r.warnings.map((w) => w.code)).not.toContain("fits-no-cell");
    // layers across the length: as many as the grown length holds at the chosen layer height
    expect(r.layers).toBe(Math.ceil(11_012.7 / r.layerHeightMm));
    expect(r.alternatives[0]).toMatchObject({ cell: "long-axis", printMode: "vertical-shell" });
    const solid = await run([11_000, 400, 300], { printMode: "solid" });
    expect(solid.printMode).toBe("vertical-solid");
  });

  it("a part that fits lying down is not stood on end for the sake of it: a 2 m block prints horizontally", async () => {
    const r = await run([1000, 2000, 500]);
    expect(r.printMode).toBe("shell");
    expect(r.fits.every((f) => !f.vertical)).toBe(true);
  });
});
