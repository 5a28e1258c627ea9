import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { LIMITS } from "../errors";
import { readStepOrIges } from "./step";
import { toMesh } from "./step-mesh";
import type { OcctResult } from "./step-occt";

// Hostile and broken inputs, made from the fixtures of mocks/fixtures/cad/ (README there).
// Every case must end in EstimateInputError with a message naming the format problem; the
// per-test timeout is the time bound (the worker pool adds its own hard limit in production).
const DIR = path.resolve(import.meta.dirname, "../../../mocks/fixtures/cad");
const text = (name: string) => readFileSync(path.join(DIR, name), "latin1");
const bytesOf = (s: string) => new Uint8Array(Buffer.from(s, "latin1"));
const BOUND = { timeout: 15_000 };

/** Deterministic noise (a linear congruential generator; Numerical Recipes constants). */
function noise(n: number, seed = 7): Uint8Array {
  const out = new Uint8Array(n);
  let s = seed >>> 0;
  for (let i = 0; i < n; i++) {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    out[i] = s >>> 24;
  }
  return out;
}

async function refusal(bytes: Uint8Array, format: "step" | "iges" = "step", opts: { maxBytes?: number } = {}) {
  const e = await readStepOrIges(bytes, { format, ...opts }).then(() => null, (x: unknown) => x);
  expect(e, "should have been refused").toBeInstanceOf(Error);
  expect((e as Error).name).toBe("EstimateInputError");
  return e as Error & { code: string };
}

const rounded = text("rounded-cube.step");
const POINT_ONLY = "ISO-10303-21;\nHEADER;\nFILE_DESCRIPTION((''),'2;1');\nENDSEC;\nDATA;\n#1=CARTESIAN_POINT('',(0.,0.,0.));\nENDSEC;\nEND-ISO-10303-21;\n";

describe("hostile STEP", () => {
  it.each([
    ["empty", "", "step:empty", /empty/],
    ["random bytes named .step", noise(100_000), "step:not-step", /does not begin with "ISO-10303-21;"/],
    ["truncated at half", rounded.slice(0, rounded.length / 2), "step:truncated", /truncated/],
    ["truncated in the last line", rounded.slice(0, rounded.lastIndexOf("END-ISO") + 5), "step:truncated", /truncated/],
    ["entity deleted (dangling reference)", rounded.replace(/^#126 = .*$/m, ""), "step:broken-entity", /#126, which the file never defines/],
    ["entity defined twice", rounded.replace(/^#126 = .*$/m, (m) => `${m}\n#126 = CARTESIAN_POINT('',(0.,0.,0.));`), "step:broken-entity", /#126 is defined twice/],
    ["unbalanced parentheses", rounded.replace(/^#126 = CYLINDRICAL_SURFACE\('',#127,5\.\);$/m, "#126 = CYLINDRICAL_SURFACE('',#127,5.;"), "step:broken-entity", /unbalanced parentheses/],
    ["statement without #id", rounded.replace(/^#126 = /m, "126 = "), "step:broken-entity", /does not start with "#number ="/],
    ["syntax error inside an entity", rounded.replace(/^#126 = .*$/m, "#126 = CYLINDRICAL_SURFACE('',#127,,,@@);"), "step:kernel-error", /could not resolve/],
    ["binary bytes inside the data", rounded.replace("#126 = ", "#126 = \u0000\u0001"), "step:binary", /binary bytes at line/],
    ["zip archive", bytesOf("PK\u0003\u0004" + "x".repeat(100)), "step:compressed", /zip/],
    ["gzip", new Uint8Array([0x1f, 0x8b, 8, 0, 0, 0]), "step:compressed", /gzip/],
    ["STEP-XML", "<?xml version='1.0'?><iso_10303_28/>", "step:xml", /STEP-XML/],
    ["no DATA section", "ISO-10303-21;\nHEADER;\nENDSEC;\nEND-ISO-10303-21;\n", "step:no-data", /no "DATA;"/],
    ["DATA section with no entities", "ISO-10303-21;\nHEADER;\nENDSEC;\nDATA;\nENDSEC;\nEND-ISO-10303-21;\n", "step:empty", /no entities/],
    ["a valid file with no shape (a single point)", POINT_ONLY, "step:no-shapes", /no shape/],
    ["entity number out of range", rounded.replace(/^#126 = /m, "#99999999999 = "), "step:broken-entity", /out of range/],
    ["unterminated string", rounded.replace("#126 = CYLINDRICAL_SURFACE('',", "#126 = CYLINDRICAL_SURFACE('"), "step:truncated", /inside a quoted string/],
  ] as const)("%s", async (_name, input, code, words) => {
    const e = await refusal(typeof input === "string" ? bytesOf(input) : input);
    expect(e.code).toBe(code);
    expect(e.message).toMatch(words);
  }, BOUND.timeout);

  it("refuses a file over the size limit before parsing", async () => {
    const e = await refusal(bytesOf(rounded), "step", { maxBytes: 1000 });
    expect(e.code).toBe("step:too-large");
    expect(e.message).toMatch(/MB accepted/);
  }, BOUND.timeout);
});

describe("hostile IGES", () => {
  const cube = text("cube-10x10.igs");
  const lines = cube.split("\n");
  it.each([
    ["empty", "", "iges:empty", /empty/],
    ["random bytes named .igs", noise(50_000, 11), "iges:not-iges", /not an IGES file/],
    ["STEP text named .igs", rounded, "iges:not-iges", /not an IGES file/],
    ["truncated at half", lines.slice(0, lines.length / 2).join("\n"), "iges:truncated", /truncated/],
    ["a parameter record removed", [...lines.slice(0, 60), ...lines.slice(61)].join("\n"), "iges:broken-record", /record number/],
    ["a record cut short", cube.replace(/\r?\n[^\n]*P\s+10\r?\n/, "\n     1 \n"), "iges:broken-record", /column 73/],
  ] as const)("%s", async (_name, input, code, words) => {
    const e = await refusal(typeof input === "string" ? bytesOf(input) : input, "iges");
    expect(e.code).toBe(code);
    expect(e.message).toMatch(words);
  }, BOUND.timeout);
});

describe("sanity checks on the kernel's output", () => {
  const body = (positions: number[], index: number[]) => ({ name: "b", attributes: { position: { array: positions } }, index: { array: index } });
  const result = (...meshes: ReturnType<typeof body>[]): OcctResult => ({ success: true, root: { name: "", meshes: meshes.map((_, i) => i), children: [] }, meshes });
  const tri = [0, 0, 0, 1, 0, 0, 0, 1, 0];

  it("refuses an absurd triangle count before allocating", () => {
    const huge = { length: (LIMITS.maxTriangles + 1) * 3 } as unknown as number[];
    expect(() => toMesh(result(body(tri, huge)), "step", null)).toThrow(/more than the 20000000/);
  });
  it("refuses an empty result", () => {
    expect(() => toMesh(result(), "step", null)).toThrow(/no solid or surface/);
    expect(() => toMesh(result(body([], [])), "iges", null)).toThrow(/IGES file holds no solid/);
  });
  it("refuses NaN, huge coordinates, absurd sizes and bad indices", () => {
    expect(() => toMesh(result(body([Number.NaN, ...tri.slice(1)], [0, 1, 2])), "step", null)).toThrow(/not a finite number/);
    expect(() => toMesh(result(body([1e12, ...tri.slice(1)], [0, 1, 2])), "step", null)).toThrow(/absurdly large/);
    expect(() => toMesh(result(body([2e5, ...tri.slice(1)], [0, 1, 2])), "step", null)).toThrow(/200 m across/);
    expect(() => toMesh(result(body(tri, [0, 1, 3])), "step", null)).toThrow(/out of range/);
    expect(() => toMesh(result(body(tri, [0, 1])), "step", null)).toThrow(/malformed/);
  });
});
