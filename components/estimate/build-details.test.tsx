import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { binaryStl, box } from "../../mocks/fixtures/meshes";
import { analyse } from "../../lib/estimating/analyse";
import { clientEstimate } from "../../lib/estimating/client-view";
import { defaultCells, defaultMaterials, defaultRateCard } from "../../lib/estimating/defaults";
import { BuildDetails } from "./build-details";

const catalogue = { cells: defaultCells, materials: defaultMaterials, rateCard: defaultRateCard };
const now = new Date("2027-03-01T09:00:00Z");
const est = (size: [number, number, number], materialKey = "abs-cf") => analyse({ bytes: binaryStl(box(...size)), fileName: "p.stl", options: { materialKey }, catalogue, now });

describe("the build on the estimate screens", () => {
  it("a 14 m beam: its pieces and the joining; piece prices (before margin) for staff only", async () => {
    const r = await est([14_000, 400, 300]);
    expect(renderToStaticMarkup(<BuildDetails r={clientEstimate(r)} priceWithheld={false} />)).not.toContain("Before margin");
    const html = renderToStaticMarkup(<BuildDetails r={r} priceWithheld={false} staff />);
    expect(html).toContain("2 pieces");
    expect(html).toContain("Long Axis");
    expect(html).toContain("Joining");
    expect(html).toContain("Before margin");
    const hidden = clientEstimate({ ...r, status: "needs-review" });
    expect(renderToStaticMarkup(<BuildDetails r={hidden} priceWithheld staff />)).not.toContain("Before margin");
  });

  it("an 11 m beam built vertically; a PA/CF part dried first, its feed held by the dryer", async () => {
    expect(renderToStaticMarkup(<BuildDetails r={await est([11_000, 400, 300])} priceWithheld={false} />)).toContain("Built vertically");
    const pa = renderToStaticMarkup(<BuildDetails r={await est([1200, 800, 300], "pa-cf")} priceWithheld={false} />);
    expect(pa).toMatch(/dried 8 h at 80 °C before the first layer/);
    expect(pa).toMatch(/dryer keeps/);
    expect(pa).toMatch(/left as printed/);
  });

  it("an estimate made before these figures shows none of them", () => {
    expect(renderToStaticMarkup(<BuildDetails r={{ printMode: "shell" }} priceWithheld={false} />)).toBe('<div class="space-y-2 text-sm" data-testid="build-details"></div>');
  });
});
