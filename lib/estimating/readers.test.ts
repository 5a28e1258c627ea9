import { describe, expect, it } from "vitest";
import { box, binaryStl, asciiStl, objFile, objWithQuads, threeMf, toMesh, uvSphere } from "../../mocks/fixtures/meshes";
import { detectStl, readAsciiStl, readBinaryStl, writeBinaryStl } from "./readers/stl";
import { readObj } from "./readers/obj";
import { read3mf } from "./readers/threemf";
import { readModel, INCH_GUESS_BELOW_UNITS } from "./read-model";
import { measure } from "./measure";

describe("binary STL layout (3D Systems, StereoLithography Interface Specification, 1988)", () => {
  it("is an 80-byte header, a uint32 count, and 50 bytes a facet: size = 84 + 50·n", () => {
    const bytes = writeBinaryStl(toMesh(box(10, 20, 30)), "test");
    expect(bytes.length).toBe(84 + 50 * 12);
    const view = new DataView(bytes.buffer);
    expect(view.getUint32(80, true)).toBe(12);
    // facet 0: normal (3 float32) then v1 at byte 84 + 12; attribute uint16 at 84 + 48
    const m = toMesh(box(10, 20, 30));
    expect(view.getFloat32(84 + 12, true)).toBe(m.positions[0]);
    expect(view.getFloat32(84 + 12 + 4 * 8, true)).toBe(m.positions[8]);
    expect(view.getUint16(84 + 48, true)).toBe(0);
    // the normal follows the right-hand rule of the winding (unit, outward)
    const n = [view.getFloat32(84, true), view.getFloat32(88, true), view.getFloat32(92, true)];
    expect(Math.hypot(n[0]!, n[1]!, n[2]!)).toBeCloseTo(1, 6);
  });

  it("a binary file whose header begins with \"solid\" is read as binary (detection by content, common practice)", () => {
    const bytes = binaryStl(box(10, 20, 30), "solid part exported as binary");
    expect(new TextDecoder().decode(bytes.subarray(0, 5))).toBe("solid");
    expect(detectStl(bytes)).toBe("stl-binary");
    expect(readBinaryStl(bytes).triangleCount).toBe(12);
  });

  it("an ASCII file is detected by its keywords and size", () => {
    const bytes = asciiStl(box(10, 20, 30));
    expect(detectStl(bytes)).toBe("stl-ascii");
    const m = readAsciiStl(bytes);
    expect(m.triangleCount).toBe(12);
    expect(Array.from(m.positions)).toEqual(Array.from(toMesh(box(10, 20, 30)).positions));
  });

  it("ASCII STL round-trips float32 coordinates exactly (sphere)", () => {
    const s = uvSphere(10);
    expect(Array.from(readAsciiStl(asciiStl(s)).positions)).toEqual(Array.from(toMesh(s).positions));
  });
});

describe("OBJ", () => {
  it("reads triangles and triangulates quads", () => {
    expect(readObj(objFile(box(10, 20, 30))).triangleCount).toBe(12);
    const q = readObj(objWithQuads(10, 20, 30));
    expect(q.triangleCount).toBe(12);
    const m = measure(q);
    expect(m.volumeMm3).toBeCloseTo(6000, 6); // closed form a·b·c
    expect(m.areaMm2).toBeCloseTo(2200, 6);
    expect(m.watertight).toBe(true);
  });

  it("accepts v/t/n references and negative (relative) indices", () => {
    const text = "v 0 0 0\nv 1 0 0\nv 0 1 0\nvt 0 0\nf 1/1/1 2/1/1 3/1/1\nf -3//1 -1//1 -2//1\n";
    const m = readObj(new TextEncoder().encode(text));
    expect(m.triangleCount).toBe(2);
    expect(Array.from(m.positions.slice(9, 18))).toEqual([0, 0, 0, 0, 1, 0, 1, 0, 0]);
  });
});

describe("3MF (3MF Consortium, 3MF Core Specification)", () => {
  it("reads the model named by _rels/.rels in millimetres", () => {
    const r = read3mf(threeMf(box(10, 20, 30)));
    expect(r.unit).toBe("millimeter");
    expect(measure(r.mesh).volumeMm3).toBeCloseTo(6000, 6);
  });

  it("applies the model unit (inch = 25.4 mm exactly, NIST SP 811)", () => {
    const r = read3mf(threeMf(box(1, 2, 3), { unit: "inch" }));
    expect(measure(r.mesh).volumeMm3 / (6 * 25.4 ** 3)).toBeCloseTo(1, 6); // float32 coordinates
  });

  it("instances components with their transforms and applies the build item's transform", () => {
    const r = read3mf(threeMf(box(10, 10, 10), { componentsOffset: [100, 0, 0], transform: [2, 0, 0, 0, 1, 0, 0, 0, 1, 5, 0, 0] }));
    const m = measure(r.mesh);
    expect(m.triangles).toBe(24);
    expect(m.shells).toBe(2);
    expect(m.volumeMm3).toBeCloseTo(2 * 2000, 6); // scaled ×2 in x
    expect(m.bounds.min[0]).toBeCloseTo(5, 6);
    expect(m.bounds.max[0]).toBeCloseTo(5 + 2 * 110, 6);
  });

  it("keeps the volume positive under a mirroring transform (winding flipped)", () => {
    const r = read3mf(threeMf(box(10, 20, 30), { transform: [-1, 0, 0, 0, 1, 0, 0, 0, 1, 0, 0, 0] }));
    expect(measure(r.mesh).volumeMm3).toBeCloseTo(6000, 6);
  });
});

describe("readModel: units", () => {
  it("guesses inches for a small unlabelled mesh and says so", async () => {
    const r = await readModel(binaryStl(box(10, 20, 30)), "part.stl");
    expect(r.units).toBe("in");
    expect(r.unitsGuessed).toBe(true);
    expect(r.unitsReason).toMatch(String(INCH_GUESS_BELOW_UNITS));
    expect(measure(r.mesh).volumeMm3).toBeCloseTo(6000 * 25.4 ** 3, -2);
  });

  it("guesses millimetres for a large one, and the caller can force the units", async () => {
    const big = await readModel(binaryStl(box(1000, 200, 300)), "tool.stl");
    expect(big.units).toBe("mm");
    const forced = await readModel(binaryStl(box(10, 20, 30)), "part.stl", { units: "mm" });
    expect(forced.units).toBe("mm");
    expect(forced.unitsGuessed).toBe(false);
    expect(measure(forced.mesh).volumeMm3).toBeCloseTo(6000, 6);
  });

  it("3MF's unit attribute wins over the guess", async () => {
    const r = await readModel(threeMf(box(10, 20, 30)), "part.3mf");
    expect(r.units).toBe("mm");
    expect(r.unitsGuessed).toBe(false);
    expect(r.format).toBe("3mf");
  });

  it("refuses unknown extensions plainly", async () => {
    await expect(readModel(new Uint8Array([1, 2, 3]), "part.dwg")).rejects.toThrow(/not supported/);
  });
});
