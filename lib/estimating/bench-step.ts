/**
 * Benchmark of the STEP/IGES reader (lib/estimating/readers/step.ts):
 *  - the CAD kernel's WebAssembly load time: once in this process (cold), and the median of
 *    fresh child processes (each pays the compile, as a new analysis worker would);
 *  - median time to tessellate the largest shipped test model (mocks/fixtures/cad/as1-oc-214.stp)
 *    at the default tolerance and at a fine one, and to tessellate + analyse it (the engine's
 *    analyse(), with the seed catalogue);
 *  - peak memory: process peak RSS and the kernel's WASM heap (it never shrinks, so the value
 *    after the runs is its peak).
 * Usage: npx tsx lib/estimating/bench-step.ts [--runs N] [--file PATH | --copies N] [--json]
 * (--copies N: a synthetic assembly of N cubes, about 19 kB each, for heap growth per MB of file.)
 */
import { execFileSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import path from "node:path";
import { readStepOrIges, warmStepKernel } from "./readers/step";

const args = process.argv.slice(2);
const flag = (name: string) => {
  const i = args.indexOf(name);
  return i >= 0 ? args[i + 1] : undefined;
};
const runs = Math.max(1, Number(flag("--runs") ?? 7));
const asJson = args.includes("--json");
const root = path.resolve(import.meta.dirname, "../..");
const copies = Number(flag("--copies") ?? 0);
const filePath = path.resolve(flag("--file") ?? path.join(root, "mocks/fixtures/cad/as1-oc-214.stp"));
const format = /\.(igs|iges)$/i.test(filePath) ? "iges" : "step";
const bytes = copies > 0 ? synthAssembly(copies) : new Uint8Array(readFileSync(filePath));

/** A large STEP file for the memory figure: N renumbered copies of cube-mm.step's DATA section. */
function synthAssembly(n: number): Uint8Array {
  const src = readFileSync(path.join(root, "mocks/fixtures/cad/cube-mm.step"), "latin1");
  const at = src.indexOf("DATA;") + 5;
  const data = src.slice(at, src.lastIndexOf("ENDSEC;"));
  const maxId = Math.max(...[...data.matchAll(/#(\d+)/g)].map((m) => Number(m[1])));
  const parts = [src.slice(0, at)];
  for (let k = 0; k < n; k++) parts.push(data.replace(/#(\d+)/g, (_, d: string) => `#${Number(d) + k * maxId}`));
  parts.push("ENDSEC;\nEND-ISO-10303-21;\n");
  return new Uint8Array(Buffer.from(parts.join(""), "latin1"));
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
};
const mb = (b: number) => Math.round((b / 2 ** 20) * 10) / 10;
const peakRssBytes = () => process.resourceUsage().maxRSS * 1024;

function childLoadMs(): number {
  const lib = createRequire(import.meta.url).resolve("occt-import-js");
  const script = `const t=performance.now();require(${JSON.stringify(lib)})({print(){},printErr(){}}).then(()=>console.log(performance.now()-t))`;
  return Number(execFileSync(process.execPath, ["-e", script], { encoding: "utf8" }).trim());
}

async function timeRuns(fn: () => Promise<unknown>): Promise<number[]> {
  await fn(); // warm-up: JIT of the reader, kernel caches
  const out: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t = performance.now();
    await fn();
    out.push(performance.now() - t);
  }
  return out;
}

const rssBefore = process.memoryUsage().rss;
const warm = await warmStepKernel();
const childLoads = Array.from({ length: 5 }, childLoadMs);

const first = await readStepOrIges(bytes, { format });
const tessellate = await timeRuns(() => readStepOrIges(bytes, { format }));
const kernelMs: number[] = [];
await timeRuns(async () => kernelMs.push((await readStepOrIges(bytes, { format })).stats.kernelMs));
const fineTol = first.toleranceMm / 10;
let fineTriangles = 0;
const fine = await timeRuns(async () => {
  fineTriangles = (await readStepOrIges(bytes, { format, toleranceMm: fineTol })).mesh.triangleCount;
});

let analyseMs: number[] | null = null;
let analyseError: string | null = null;
try {
  const { analyse } = await import("./analyse");
  const { defaultCells, defaultMaterials, defaultRateCard } = await import("./defaults");
  const input = {
    bytes,
    fileName: path.basename(filePath),
    options: {},
    catalogue: { materials: defaultMaterials, cells: defaultCells, rateCard: defaultRateCard },
    now: new Date("2026-12-01T08:00:00Z"),
  };
  analyseMs = await timeRuns(() => analyse(input));
} catch (e) {
  analyseError = e instanceof Error ? e.message : String(e);
}
const heapAfter = (await warmStepKernel()).wasmHeapBytes;

const report = {
  file: copies > 0 ? `synthetic: ${copies} × cube-mm.step` : path.relative(root, filePath),
  fileBytes: bytes.length,
  bodies: first.bodyNames.length,
  triangles: first.mesh.triangleCount,
  toleranceMm: first.toleranceMm,
  runs,
  moduleLoadMsInProcess: Math.round(warm.moduleLoadMs),
  moduleLoadMsMedianFresh: Math.round(median(childLoads)),
  tessellateMsMedian: Math.round(median(tessellate)),
  kernelMsMedian: Math.round(median(kernelMs)),
  fineToleranceMm: fineTol,
  fineTriangles,
  fineTessellateMsMedian: Math.round(median(fine)),
  analyseMsMedian: analyseMs ? Math.round(median(analyseMs)) : null,
  analyseError,
  wasmHeapMbInitial: mb(warm.wasmHeapBytes),
  wasmHeapMbPeak: mb(heapAfter),
  rssMbBefore: mb(rssBefore),
  rssMbPeak: mb(peakRssBytes()),
};

if (asJson) {
  console.log(JSON.stringify(report));
} else {
  console.log(`STEP reader benchmark — ${report.file} (${(bytes.length / 1024).toFixed(0)} kB, ${report.bodies} bodies), ${runs} runs, medians`);
  console.log(`  kernel load: ${report.moduleLoadMsInProcess} ms in this process, ${report.moduleLoadMsMedianFresh} ms median of 5 fresh processes`);
  console.log(`  tessellate (tolerance ${report.toleranceMm.toFixed(4)} mm, ${report.triangles} triangles): ${report.tessellateMsMedian} ms (kernel ${report.kernelMsMedian} ms)`);
  console.log(`  tessellate (tolerance ${fineTol.toFixed(4)} mm, ${fineTriangles} triangles): ${report.fineTessellateMsMedian} ms`);
  console.log(`  tessellate + analyse: ${report.analyseMsMedian === null ? `not run (${analyseError})` : `${report.analyseMsMedian} ms`}`);
  console.log(`  WASM heap: ${report.wasmHeapMbInitial} MB after load, ${report.wasmHeapMbPeak} MB peak; RSS ${report.rssMbBefore} MB at start, ${report.rssMbPeak} MB peak`);
}
