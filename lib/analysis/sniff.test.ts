import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { asciiStl, binaryStl, box, objFile, threeMf } from "@/mocks/fixtures/meshes";
import { checkModelUpload, SNIFF_HEAD_BYTES, sniffModelFormat } from "./sniff";

const cad = (f: string) => new Uint8Array(readFileSync(`mocks/fixtures/cad/${f}`));

describe("sniffModelFormat (by content)", () => {
  const b = box(100, 200, 300);
  it.each([
    ["binary STL", binaryStl(b), "stl-binary"],
    ["ASCII STL", asciiStl(b), "stl-ascii"],
    ["OBJ", objFile(b), "obj"],
    ["3MF", threeMf(b), "3mf"],
    ["STEP (ISO 10303-21 test file)", cad("cube-mm.step"), "step"],
    ["IGES", cad("cube-10x10.igs"), "iges"],
  ] as const)("%s", (_n, bytes, format) => {
    expect(sniffModelFormat(bytes)).toBe(format);
  });

  it("refuses a PDF, a PNG, random bytes and a truncated binary STL", () => {
    expect(sniffModelFormat(new TextEncoder().encode("%PDF-1.7\n%âãÏÓ\n1 0 obj"))).toBeNull();
    expect(sniffModelFormat(new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0]))).toBeNull();
    const rnd = new Uint8Array(5000);
    for (let i = 0; i < rnd.length; i++) rnd[i] = (i * 2654435761) >>> 24;
    expect(sniffModelFormat(rnd)).toBeNull();
    const stl = binaryStl(b);
    expect(sniffModelFormat(stl.slice(0, stl.length - 7))).toBeNull();
  });
});

describe("checkModelUpload", () => {
  it("accepts content that matches the name", () => {
    expect(checkModelUpload(binaryStl(box(1, 2, 3)), "mold.STL")).toEqual({ ok: true, format: "stl-binary" });
  });
  it("refuses a renamed file with a message naming both", () => {
    const r = checkModelUpload(new TextEncoder().encode("%PDF-1.7 hello"), "drawing.stl");
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toContain("drawing.stl");
    const r2 = checkModelUpload(objFile(box(1, 2, 3)), "part.stl");
    expect(r2.ok).toBe(false);
    if (!r2.ok) expect(r2.message).toMatch(/holds OBJ data/);
  });
  it("refuses unknown extensions and empty files", () => {
    expect(checkModelUpload(binaryStl(box(1, 2, 3)), "part.dwg").ok).toBe(false);
    expect(checkModelUpload(new Uint8Array(), "part.stl").ok).toBe(false);
  });
});

describe("sniffing from the head of a file only", () => {
  it("gives the same answer from the first SNIFF_HEAD_BYTES and the whole length as from the whole file", () => {
    const whole = binaryStl(box(600, 300, 150));
    const text = asciiStl(box(10, 10, 10));
    for (const [bytes, name] of [[whole, "a.stl"], [text, "b.stl"]] as const) {
      const head = bytes.subarray(0, SNIFF_HEAD_BYTES);
      expect(checkModelUpload(head, name, bytes.length)).toEqual(checkModelUpload(bytes, name));
    }
    // A binary STL whose stated facet count disagrees with the stored length is refused.
    expect(checkModelUpload(whole.subarray(0, SNIFF_HEAD_BYTES), "a.stl", whole.length + 50).ok).toBe(false);
    expect(checkModelUpload(new Uint8Array(0), "a.stl", 0)).toMatchObject({ ok: false, message: expect.stringContaining("empty") });
  });
});
