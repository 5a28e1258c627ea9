import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { benchPattern, binaryStl, toMesh, torus } from "../../mocks/fixtures/meshes";
import { ensureBundle } from "../scripts/engine-bundles.mjs";
import { analyse } from "./analyse";
import { defaultCells, defaultMaterials, defaultRateCard } from "./defaults";
import { indexSoup, type IndexedMesh } from "./indexed";
import { bounds } from "./measure";
import { readModelFile } from "./read-model-file";
import { slice, type Sections } from "./slice";
import { sliceThread, type SliceJob } from "./slice-ahead";

const dir = mkdtempSync(path.join(tmpdir(), "lw-slice-ahead-"));
let workerFile = "";
let mesh: IndexedMesh;
let jobs: SliceJob[];

const bits = (s: Sections) => [...new Uint8Array(s.area.buffer, s.area.byteOffset, s.area.byteLength), ...new Uint8Array(s.perimeter.buffer, s.perimeter.byteOffset, s.perimeter.byteLength), ...s.segments];

beforeAll(async () => {
  // the helper as the command line runs it: its own bundle
  workerFile = await ensureBundle("slicer");
  // a streamed STL: the mesh in shared memory, as the command line reads it
  const file = path.join(dir, "pattern.stl");
  writeFileSync(file, binaryStl(benchPattern(40_000)));
  mesh = (await readModelFile(file, "pattern.stl", { units: "mm" })).mesh as IndexedMesh;
  const b = bounds(mesh.vertices);
  jobs = (["z", "x", "y"] as const).map((up, i) => ({ up, z0: b.min[i === 0 ? 2 : i === 1 ? 0 : 1] - 6, h: 3, count: 600 }));
}, 60_000);

describe("slicing on a helper thread", () => {
  it("the streamed mesh lives in shared memory", () => {
    expect(mesh.vertices.buffer).toBeInstanceOf(SharedArrayBuffer);
    expect(mesh.indices.buffer).toBeInstanceOf(SharedArrayBuffer);
  });

  it("gives the same sections, bit for bit, as slicing in line, whichever thread cut them", async () => {
    const helper = sliceThread(workerFile, { always: true });
    try {
      // the helper boots while the caller reads; here it is given a moment to claim the jobs
      await new Promise((r) => setTimeout(r, 1500));
      const run = helper.start(mesh, jobs);
      expect(run).not.toBeNull();
      await new Promise((r) => setTimeout(r, 1500));
      const cut = run!.finish();
      expect(cut).toHaveLength(3);
      cut.forEach((s, i) => {
        const j = jobs[i]!;
        const inLine = slice(mesh, j.z0, j.h, j.count, j.up);
        expect(s).toMatchObject({ z0: j.z0, layerHeight: j.h, count: j.count });
        expect(bits(s)).toEqual(bits(inLine));
      });
      // sections the helper cut come back in shared memory: at least one job was its own
      expect(cut.some((s) => s.area.buffer instanceof SharedArrayBuffer)).toBe(true);
    } finally {
      helper.close();
    }
  }, 60_000);

  it("a helper that never answers costs nothing but the caller's own cutting", () => {
    const silent = path.join(dir, "silent.mjs");
    writeFileSync(silent, "import { parentPort } from 'node:worker_threads'; parentPort.on('message', () => {});\n");
    const helper = sliceThread(silent, { always: true });
    try {
      const cut = helper.start(mesh, jobs)!.finish();
      cut.forEach((s, i) => expect(bits(s)).toEqual(bits(slice(mesh, jobs[i]!.z0, jobs[i]!.h, jobs[i]!.count, jobs[i]!.up))));
    } finally {
      helper.close();
    }
  });

  it("a helper that stops mid-job is not waited for: the caller cuts that job too", async () => {
    // claims the first job, reports it nearly done, then never moves again
    const stuck = path.join(dir, "stuck.mjs");
    writeFileSync(stuck, [
      "import { parentPort } from 'node:worker_threads';",
      "parentPort.on('message', ({ state, jobs }) => {",
      "  Atomics.add(state, 0, 1); Atomics.store(state, 2, jobs[0].count - 1);",
      "  Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0);",
      "});",
    ].join("\n"));
    const helper = sliceThread(stuck, { always: true });
    try {
      const run = helper.start(mesh, jobs)!;
      await new Promise((r) => setTimeout(r, 1000));
      const cut = run.finish();
      cut.forEach((s, i) => expect(bits(s)).toEqual(bits(slice(mesh, jobs[i]!.z0, jobs[i]!.h, jobs[i]!.count, jobs[i]!.up))));
    } finally {
      helper.close();
    }
  }, 60_000);

  it("an estimate with the helper is the estimate without it", async () => {
    const catalogue = { materials: defaultMaterials, cells: defaultCells, rateCard: defaultRateCard };
    const file = path.join(dir, "pattern.stl");
    const estimate = async (sliceAhead?: ReturnType<typeof sliceThread>) =>
      analyse({ read: await readModelFile(file, "pattern.stl", {}), fileName: "pattern.stl", options: {}, catalogue, now: new Date("2027-03-01T09:00:00Z"), sliceAhead });
    const helper = sliceThread(workerFile, { always: true });
    try {
      expect(JSON.stringify(await estimate(helper))).toBe(JSON.stringify(await estimate()));
    } finally {
      helper.close();
    }
  }, 60_000);

  it("takes no work for a mesh outside shared memory (the caller slices in line)", () => {
    const helper = sliceThread(workerFile, { always: true });
    try {
      const plain = indexSoup(toMesh(torus(10, 3, 16, 8)));
      expect(plain.vertices.buffer).not.toBeInstanceOf(SharedArrayBuffer);
      expect(helper.start(plain, jobs)).toBeNull();
    } finally {
      helper.close();
    }
  });
});
