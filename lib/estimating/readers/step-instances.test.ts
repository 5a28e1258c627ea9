import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { readStepOrIges } from "./step";
import { stepInstanceCount } from "./step-instances";
import { scanStep } from "./step-scan";

// Nested copies in a STEP file, counted before the CAD kernel runs (step-instances.ts). The
// fixtures are those of mocks/fixtures/cad/ (README there); the hostile files are built here.
const DIR = path.resolve(import.meta.dirname, "../../../mocks/fixtures/cad");
const text = (name: string) => readFileSync(path.join(DIR, name), "latin1");
const bytesOf = (s: string) => new Uint8Array(Buffer.from(s, "latin1"));
const count = (s: string) => {
  const b = bytesOf(s);
  return stepInstanceCount(b, scanStep(b));
};
const rounded = text("rounded-cube.step");
/** The rounded cube with extra entities before its DATA section's end. */
const withEntities = (lines: string[]) => rounded.replace(/ENDSEC;\s*END-ISO-10303-21;\s*$/, `${lines.join("\n")}\nENDSEC;\nEND-ISO-10303-21;\n`);

/** `levels` product definitions, each holding `fan` occurrences of the next (about 60 bytes an occurrence). */
function nestedOccurrences(levels: number, fan: number): string[] {
  const lines: string[] = [];
  for (let l = 0; l <= levels; l++) lines.push(`#${800000 + l} = PRODUCT_DEFINITION('l${l}','',#1,#1);`);
  let id = 810000;
  for (let l = 0; l < levels; l++) for (let k = 0; k < fan; k++) lines.push(`#${id++} = NEXT_ASSEMBLY_USAGE_OCCURRENCE('${k}','','',#${800000 + l},#${800001 + l},$);`);
  return lines;
}

/** `levels` representations, each listing `fan` mapped copies of the next. */
function nestedMappedItems(levels: number, fan: number): string[] {
  const lines: string[] = [];
  let id = 820000;
  for (let l = 0; l < levels; l++) {
    lines.push(`#${830000 + l} = REPRESENTATION_MAP(#1,#${840000 + l + 1});`);
    const items: string[] = [];
    for (let k = 0; k < fan; k++) {
      lines.push(`#${id} = MAPPED_ITEM('',#${830000 + l},#1);`);
      items.push(`#${id++}`);
    }
    lines.push(`#${840000 + l} = SHAPE_REPRESENTATION('l${l}',(${items.join(",")}),#1);`);
  }
  lines.push(`#${840000 + levels} = SHAPE_REPRESENTATION('leaf',(#1),#1);`);
  return lines;
}

describe("STEP component graph", () => {
  it("counts an ordinary assembly alike from three exporters (CAx-IF AS1, 18 bodies: 28 nodes in its expanded tree, the root included)", () => {
    for (const f of ["as1-oc-214.stp", "as1-tu-203.stp", "as1_pe_203.stp"]) expect(count(text(f)), f).toBe(28);
    expect(count(rounded)).toBe(1);
  });

  it("counts nested occurrences as they multiply, each shared level visited once", () => {
    expect(count(withEntities(nestedOccurrences(3, 4)))).toBe(1 + 1 + 4 + 16 + 64);
    expect(count(withEntities(nestedMappedItems(2, 3)))).toBe(1 + 1 + 3 + 9);
  });

  it.each([
    ["occurrences ten by ten, twelve deep", nestedOccurrences(12, 10)],
    ["mapped items ten by ten, twelve deep", nestedMappedItems(12, 10)],
  ])("refuses %s before the kernel runs, quickly and with a plain message", async (_name, lines) => {
    const bomb = withEntities(lines);
    const t = Date.now();
    const e = await readStepOrIges(bytesOf(bomb), { format: "step" }).then(() => null, (x: unknown) => x as Error & { code: string });
    expect(e?.name).toBe("EstimateInputError");
    expect(e?.code).toBe("step:too-many-instances");
    expect(e?.message).toMatch(/expands to more than 10,000 part instances/);
    expect(Date.now() - t).toBeLessThan(5_000);
  }, 30_000);

  it("refuses an assembly that contains itself", () => {
    const cycle = withEntities([
      "#800000 = PRODUCT_DEFINITION('a','',#1,#1);",
      "#800001 = PRODUCT_DEFINITION('b','',#1,#1);",
      "#810000 = NEXT_ASSEMBLY_USAGE_OCCURRENCE('1','','',#800000,#800001,$);",
      "#810001 = NEXT_ASSEMBLY_USAGE_OCCURRENCE('2','','',#800001,#800000,$);",
    ]);
    expect(() => count(cycle)).toThrow(/contains itself/);
  });
});
