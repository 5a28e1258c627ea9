import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import type { Mesh } from "./types";
import { asciiStl, binaryStl, layupMold, uvSphere } from "../../mocks/fixtures/meshes";
import { indexSoup, isIndexed, toSoup, type IndexedMesh } from "./indexed";
import { analyse } from "./analyse";
import { defaultCells, defaultMaterials, defaultRateCard } from "./defaults";
import { readModel } from "./read-model";
import { readModelFile } from "./read-model-file";

const dir = mkdtempSync(path.join(tmpdir(), "lw-read-file-"));
const sameFloats = (a: Float32Array, b: Float32Array) => Buffer.compare(Buffer.from(a.buffer, a.byteOffset, a.byteLength), Buffer.from(b.buffer, b.byteOffset, b.byteLength)) === 0;
const indexedOf = (m: Mesh | IndexedMesh) => { if (!isIndexed(m)) throw new Error("expected the indexed mesh of a streamed binary STL"); return m; };
const write = (name: string, bytes: Uint8Array) => { const f = path.join(dir, name); writeFileSync(f, bytes); return f; };

describe("reading a model from disk", () => {
  it("streams a binary STL of several chunks into the same triangles as the in-memory reader", async () => {
    // a 160 × 80 mold: several of the streaming reader's 4,096-facet chunks
    const bytes = binaryStl(layupMold(160, 80));
    const f = write("mold.stl", bytes);
    const streamed = await readModelFile(f, "mold.stl");
    const whole = await readModel(bytes, "mold.stl");
    expect(streamed.mesh.triangleCount).toBeGreaterThan(20_000);
    expect(streamed.mesh.triangleCount).toBe(whole.mesh.triangleCount);
    const m = indexedOf(streamed.mesh);
    // the soup rebuilt from the streamed vertices and indices is the in-memory reader's, bit for bit
    expect(sameFloats(toSoup(m).positions, whole.mesh.positions)).toBe(true);
    // and the streamed indexing is the in-memory indexing of that soup (same vertices, same numbering)
    const again = indexSoup(whole.mesh);
    expect(m.vertexCount).toBe(again.vertexCount);
    expect(m.vertexCount).toBeLessThan(m.triangleCount); // shared corners: about half a vertex a triangle
    expect(sameFloats(m.vertices, again.vertices)).toBe(true);
    expect(Buffer.compare(Buffer.from(m.indices.buffer), Buffer.from(again.indices.buffer))).toBe(0);
    expect(streamed).toMatchObject({ format: "stl-binary", units: whole.units, unitsGuessed: true, unitsReason: whole.unitsReason });
  });

  it("applies the user's units and scales inches like the in-memory reader", async () => {
    const bytes = binaryStl(uvSphere(10));
    const f = write("sphere.stl", bytes);
    const streamed = await readModelFile(f, "sphere.stl", { units: "in" });
    const whole = await readModel(bytes, "sphere.stl", { units: "in" });
    expect(streamed.units).toBe("in");
    expect(sameFloats(toSoup(indexedOf(streamed.mesh)).positions, whole.mesh.positions)).toBe(true);
  });

  it("the estimate of a streamed file is the estimate of its bytes, in millimetres and in inches", async () => {
    const catalogue = { cells: defaultCells, materials: defaultMaterials, rateCard: defaultRateCard };
    const now = new Date("2027-03-01T09:00:00Z");
    for (const [name, bytes, units] of [["mold.stl", binaryStl(layupMold(160, 80)), undefined], ["sphere.stl", binaryStl(uvSphere(10)), "in"]] as const) {
      const f = write(name, bytes);
      const options = { units };
      const streamed = await analyse({ read: await readModelFile(f, name, options), fileName: name, options, catalogue, now });
      const whole = await analyse({ bytes, fileName: name, options, catalogue, now });
      expect(streamed).toEqual(whole);
    }
  });

  it("reads other files whole: ASCII STL", async () => {
    const f = write("sphere-ascii.stl", asciiStl(uvSphere(10, 16, 8)));
    const r = await readModelFile(f, "sphere-ascii.stl");
    expect(r.format).toBe("stl-ascii");
    expect(r.mesh.triangleCount).toBe(16 * 8 * 2 - 2 * 16);
  });

  it("a truncated binary STL, an empty file and a missing file give the readers' plain errors", async () => {
    const bytes = binaryStl(uvSphere(10));
    await expect(readModelFile(write("cut.stl", bytes.subarray(0, bytes.length - 7)), "cut.stl")).rejects.toMatchObject({ code: "stl:truncated" });
    await expect(readModelFile(write("empty.stl", new Uint8Array(0)), "empty.stl")).rejects.toMatchObject({ code: "file:empty" });
    await expect(readModelFile(path.join(dir, "nope.stl"), "nope.stl")).rejects.toMatchObject({ code: "file:unreadable" });
  });

  it("a NaN coordinate deep in a streamed file is refused", async () => {
    const bytes = binaryStl(layupMold(160, 80));
    const view = new DataView(bytes.buffer);
    view.setFloat32(84 + 50 * 25_000 + 12 + 4, Number.NaN, true); // facet 25,000: a later chunk
    await expect(readModelFile(write("nan.stl", bytes), "nan.stl")).rejects.toMatchObject({ code: "mesh:bad-coordinate" });
  });
});
