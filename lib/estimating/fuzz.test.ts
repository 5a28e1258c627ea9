import { zipSync, strToU8 } from "fflate";
import { describe, expect, it } from "vitest";
import { asciiStl, binaryStl, box, objFile, threeMf, uvSphere } from "../../mocks/fixtures/meshes";
import { readModel } from "./read-model";
import { isEstimateInputError } from "./errors";

/**
 * Hostile and broken files: every reader must answer with an EstimateInputError (a plain
 * message), never another exception, a hang or unbounded memory. Time is bounded by vitest's
 * test timeout; sizes are kept small so memory stays bounded.
 */
let seed = 12345;
const rand = () => { seed = (Math.imul(seed, 1103515245) + 12345) >>> 0; return seed / 2 ** 32; };
const randomBytes = (n: number) => Uint8Array.from({ length: n }, () => Math.floor(rand() * 256));

async function outcome(bytes: Uint8Array, name: string): Promise<"ok" | string> {
  try {
    const r = await readModel(bytes, name);
    expect(r.mesh.triangleCount).toBeGreaterThan(0);
    for (const v of r.mesh.positions) if (!Number.isFinite(v)) throw new Error("non-finite coordinate passed through");
    return "ok";
  } catch (e) {
    if (!isEstimateInputError(e)) throw e;
    expect(e.message.length).toBeGreaterThan(10);
    expect(e.message).not.toMatch(/\n/);
    return e.code;
  }
}

describe("fuzzing the readers", () => {
  it("random bytes under every extension", async () => {
    for (let i = 0; i < 200; i++) {
      const bytes = randomBytes(1 + Math.floor(rand() * 4000));
      for (const ext of ["stl", "obj", "3mf"]) await outcome(bytes, `x.${ext}`);
    }
  });

  it("truncated files at many lengths", async () => {
    const files: [Uint8Array, string][] = [[binaryStl(uvSphere(10, 16, 8)), "a.stl"], [asciiStl(box(1, 2, 3)), "b.stl"], [objFile(box(1, 2, 3)), "c.obj"], [threeMf(box(1, 2, 3)), "d.3mf"]];
    for (const [bytes, name] of files) {
      for (let i = 0; i < 60; i++) await outcome(bytes.slice(0, Math.floor(rand() * bytes.length)), name);
    }
    const cut = binaryStl(box(1, 2, 3)).slice(0, 84 + 50 * 5);
    expect(await outcome(cut, "t.stl")).toBe("stl:truncated");
  });

  it("NaN and infinity coordinates", async () => {
    const b = binaryStl(box(1, 2, 3));
    const v = new DataView(b.buffer);
    v.setFloat32(84 + 12, NaN, true);
    expect(await outcome(b, "n.stl")).toBe("mesh:bad-coordinate");
    v.setFloat32(84 + 12, Infinity, true);
    expect(await outcome(b, "i.stl")).toBe("mesh:bad-coordinate");
    expect(await outcome(new TextEncoder().encode("solid x\nfacet normal 0 0 0\nouter loop\nvertex nan 0 0\nvertex 1 0 0\nvertex 0 1 0\nendloop\nendfacet\nendsolid x\n"), "a.stl")).toBe("mesh:bad-coordinate");
    expect(await outcome(new TextEncoder().encode("v 0 0 0\nv 1e999 0 0\nv 0 1 0\nf 1 2 3\n"), "a.obj")).toBe("mesh:bad-coordinate");
  });

  it("a count field claiming billions of facets is refused before any allocation", async () => {
    const b = binaryStl(box(1, 2, 3));
    new DataView(b.buffer).setUint32(80, 4_000_000_000, true);
    expect(await outcome(b, "big.stl")).toBe("stl:too-many");
    const zero = binaryStl(box(1, 2, 3)).slice(0, 84);
    new DataView(zero.buffer).setUint32(80, 0, true);
    expect(await outcome(zero, "zero.stl")).toBe("stl:empty");
  });

  it("ASCII garbage", async () => {
    for (const text of ["solid a\nfacet normal 0 0 0\nouter loop\nvertex 1 2\nendloop\n", "solid a\nbanana\n", "solid a\nfacet normal 0 0 0\nouter loop\nvertex 1 2 3\nvertex 1 2 3\nendloop\nendfacet\nendsolid\n", "solid\nendsolid\n", "solid a\nvertex x y z\n"]) {
      expect(await outcome(new TextEncoder().encode(text), "g.stl")).not.toBe("ok");
    }
    for (let i = 0; i < 50; i++) {
      const words = ["solid", "facet", "normal", "vertex", "outer", "loop", "endloop", "endfacet", "1.5", "-2", "e", "\n", " "];
      const text = Array.from({ length: 200 }, () => words[Math.floor(rand() * words.length)]).join(" ");
      await outcome(new TextEncoder().encode(text), "g.stl");
    }
  });

  it("OBJ with indices out of range, zero or non-numeric", async () => {
    for (const text of ["v 0 0 0\nv 1 0 0\nv 0 1 0\nf 1 2 4\n", "v 0 0 0\nv 1 0 0\nv 0 1 0\nf 0 1 2\n", "v 0 0 0\nf -5 1 1\n", "v 0 0 0\nv 1 0 0\nf 1 2\n", "v 0 0 0\nf a b c\n", "# nothing\n"]) {
      expect(await outcome(new TextEncoder().encode(text), "bad.obj")).not.toBe("ok");
    }
  });

  it("a 3MF zip bomb is refused from its declared sizes, quickly", async () => {
    const big = new Uint8Array(600 * 1024 * 1024 / 8); // 75 MB of zeros, compresses ~1000:1
    const zip = zipSync({ "_rels/.rels": strToU8('<Relationships><Relationship Type="http://schemas.microsoft.com/3dmanufacturing/2013/01/3dmodel" Target="/3D/3dmodel.model"/></Relationships>'), "3D/3dmodel.model": big }, { level: 9 });
    const t = Date.now();
    expect(await outcome(zip, "bomb.3mf")).toBe("3mf:zip-bomb");
    expect(Date.now() - t).toBeLessThan(5000);
    // a header lying about the size only truncates the output (the model then fails to parse)
    const real = threeMf(box(1, 2, 3));
    const dv = new DataView(real.buffer);
    for (let i = 0; i + 4 <= real.length; i++) {
      const sig = dv.getUint32(i, true);
      if (sig === 0x04034b50) dv.setUint32(i + 22, 10, true);
      if (sig === 0x02014b50) dv.setUint32(i + 24, 10, true);
    }
    expect(await outcome(real, "lying.3mf")).not.toBe("ok");
  }, 30_000);

  it("3MF with missing parts, objects or build", async () => {
    const rels = strToU8('<Relationships><Relationship Type="http://schemas.microsoft.com/3dmanufacturing/2013/01/3dmodel" Target="/3D/missing.model"/></Relationships>');
    expect(await outcome(zipSync({ "_rels/.rels": rels }), "a.3mf")).toBe("3mf:missing-part");
    expect(await outcome(zipSync({ "x.txt": strToU8("hi") }), "b.3mf")).toBe("3mf:missing-model");
    const model = (body: string) => zipSync({ "3D/3dmodel.model": strToU8(`<model unit="millimeter"><resources>${body}</resources><build><item objectid="9"/></build></model>`) });
    expect(await outcome(model(""), "c.3mf")).toBe("3mf:missing-object");
    expect(await outcome(zipSync({ "3D/3dmodel.model": strToU8('<model><resources></resources><build></build></model>') }), "d.3mf")).toBe("3mf:empty-build");
    const selfRef = zipSync({ "3D/3dmodel.model": strToU8('<model><resources><object id="1"><components><component objectid="1"/></components></object></resources><build><item objectid="1"/></build></model>') });
    expect(await outcome(selfRef, "e.3mf")).toBe("3mf:deep-components");
    const badIndex = zipSync({ "3D/3dmodel.model": strToU8('<model><resources><object id="1"><mesh><vertices><vertex x="0" y="0" z="0"/></vertices><triangles><triangle v1="0" v2="1" v3="2"/></triangles></mesh></object></resources><build><item objectid="1"/></build></model>') });
    expect(await outcome(badIndex, "f.3mf")).toBe("3mf:bad-index");
    expect(await outcome(zipSync({ "3D/3dmodel.model": strToU8('<model unit="parsec"></model>') }), "g.3mf")).toBe("3mf:bad-unit");
  });

  it("3MF components nested ten by ten, twelve deep (about a kilobyte, 10^12 instances), are refused before tessellating", async () => {
    // Each level holds ten copies of the next; the innermost is empty, so no triangle limit is
    // ever reached: only a bound on the instances the graph expands to stops it.
    const levels = Array.from({ length: 12 }, (_, i) => `<object id="${i + 2}"><components>${`<component objectid="${i + 3}"/>`.repeat(10)}</components></object>`).join("");
    const leaf = `<object id="14"><components></components></object>`;
    const mesh = '<object id="1"><mesh><vertices><vertex x="0" y="0" z="0"/><vertex x="1" y="0" z="0"/><vertex x="0" y="1" z="0"/><vertex x="0" y="0" z="1"/></vertices><triangles><triangle v1="0" v2="2" v3="1"/><triangle v1="0" v2="1" v3="3"/><triangle v1="0" v2="3" v3="2"/><triangle v1="1" v2="2" v3="3"/></triangles></mesh></object>';
    const bomb = zipSync({ "3D/3dmodel.model": strToU8(`<model unit="millimeter"><resources>${mesh}${levels}${leaf}</resources><build><item objectid="1"/><item objectid="2"/></build></model>`) });
    expect(bomb.length).toBeLessThan(2048);
    const t = Date.now();
    expect(await outcome(bomb, "nested.3mf")).toBe("3mf:too-many-instances");
    expect(Date.now() - t).toBeLessThan(5_000);
    // A plate of 400 copies (20 × 20 by components) of one part is an ordinary file and reads.
    const plate = zipSync({ "3D/3dmodel.model": strToU8(`<model unit="millimeter"><resources>${mesh}<object id="2"><components>${'<component objectid="1"/>'.repeat(20)}</components></object><object id="3"><components>${'<component objectid="2"/>'.repeat(20)}</components></object></resources><build><item objectid="3"/></build></model>`) });
    expect(await outcome(plate, "plate.3mf")).toBe("ok");
    expect((await readModel(plate, "plate.3mf")).mesh.triangleCount).toBe(400 * 4);
  }, 60_000);

  it("an unterminated attribute quote in a large 3MF model costs bounded time", async () => {
    const junk = "<vertex x=\"" + "1".repeat(200_000) + " <vertex y=\"".repeat(2000);
    const zip = zipSync({ "3D/3dmodel.model": strToU8(`<model><resources><object id="1"><mesh><vertices>${junk}`) });
    const t = Date.now();
    await outcome(zip, "slow.3mf");
    expect(Date.now() - t).toBeLessThan(10_000);
  }, 30_000);
});
