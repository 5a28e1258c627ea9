import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { asciiStl, binaryStl, layupMold, uvSphere } from "../../mocks/fixtures/meshes";
import { readModel } from "./read-model";
import { readModelFile } from "./read-model-file";

const dir = mkdtempSync(path.join(tmpdir(), "lw-read-file-"));
const sameFloats = (a: Float32Array, b: Float32Array) => Buffer.compare(Buffer.from(a.buffer, a.byteOffset, a.byteLength), Buffer.from(b.buffer, b.byteOffset, b.byteLength)) === 0;
const write = (name: string, bytes: Uint8Array) => { const f = path.join(dir, name); writeFileSync(f, bytes); return f; };

describe("reading a model from disk", () => {
  it("streams a binary STL of several chunks into the same triangles as the in-memory reader", async () => {
    // a 160 × 80 mold: more triangles than one of the streaming reader's 20,000-facet chunks
    const bytes = binaryStl(layupMold(160, 80));
    const f = write("mold.stl", bytes);
    const streamed = await readModelFile(f, "mold.stl");
    const whole = await readModel(bytes, "mold.stl");
    expect(streamed.mesh.triangleCount).toBeGreaterThan(20_000);
    expect(streamed.mesh.triangleCount).toBe(whole.mesh.triangleCount);
    expect(sameFloats(streamed.mesh.positions, whole.mesh.positions)).toBe(true);
    expect(streamed).toMatchObject({ format: "stl-binary", units: whole.units, unitsGuessed: true, unitsReason: whole.unitsReason });
  });

  it("applies the user's units and scales inches like the in-memory reader", async () => {
    const bytes = binaryStl(uvSphere(10));
    const f = write("sphere.stl", bytes);
    const streamed = await readModelFile(f, "sphere.stl", { units: "in" });
    const whole = await readModel(bytes, "sphere.stl", { units: "in" });
    expect(streamed.units).toBe("in");
    expect(sameFloats(streamed.mesh.positions, whole.mesh.positions)).toBe(true);
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
    view.setFloat32(84 + 50 * 25_000 + 12 + 4, Number.NaN, true); // facet 25,000: second chunk
    await expect(readModelFile(write("nan.stl", bytes), "nan.stl")).rejects.toMatchObject({ code: "mesh:bad-coordinate" });
  });
});
