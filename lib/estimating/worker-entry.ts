import { createHash } from "node:crypto";
import { readlinkSync } from "node:fs";
import { setPriority } from "node:os";
import { parentPort } from "node:worker_threads";
import { checkModelUpload } from "../analysis/sniff";
import { analyse, type AnalyseInput } from "./analyse";
import { EstimateInputError } from "./errors";
import { fetchModelBytes } from "./fetch-model";
import { readModel } from "./read-model";
import type { JobInput, ReadJob, RemoteFile } from "./pool";
import { loadedOcctHeapBytes } from "./readers/step-occt";

/**
 * The CAD kernel's WebAssembly memory only grows and no thread limit covers it, so after each
 * file a worker whose kernel holds more than this asks to be retired (a fresh one loads the
 * kernel again in about a quarter of a second).
 */
const RETIRE_ABOVE_BYTES = (Number(process.env.ESTIMATE_WASM_RETIRE_MB) || 768) * 1024 * 1024;

/**
 * Worker-thread entry of the estimate pool. Bundled on its own by lib/scripts/build-worker.ts into
 * .worker/estimate-worker.mjs (the app's bundler never sees it). Messages:
 * in  { id, input } (input.bytes, or input.remote: a signed URL fetched here) | { id, read }; out { id, type: "progress", fraction, stage } | { id, type: "result", result }
 * | { id, type: "error", error: { name, code, message } }; each result or error may carry
 * `retire: true` when the worker should be replaced before its next job.
 */
if (!parentPort) throw new Error("estimate worker must run in a worker thread");
lowerThreadPriority();
const port = parentPort;
type WorkerMessage = { id: number; input: JobInput; read?: undefined } | { id: number; read: ReadJob; input?: undefined };

/** One job: every failure is answered to the pool as an error message, never thrown. */
async function handle(msg: WorkerMessage): Promise<void> {
  const { id } = msg;
  try {
    if (msg.read) {
      // Only the mesh, for the 3D preview: STEP/IGES tessellation must not run on the web thread either.
      const job = msg.read;
      const bytes = "remote" in job ? (await fetched({ remote: job.remote, fileName: job.fileName })).bytes : job.bytes;
      const r = await readModel(bytes, job.fileName, job.options);
      const triangles = r.mesh.positions.length / 9;
      const positions = thinned(r.mesh.positions, job.options.maxTriangles);
      port.postMessage({ id, type: "result", result: { positions, triangles, format: r.format, units: r.units }, retire: shouldRetire() }, [positions.buffer as ArrayBuffer]);
      return;
    }
    const input: AnalyseInput = "remote" in msg.input ? await fetched(msg.input) : msg.input;
    // The file's SHA-256 is worked out here, where the whole file is read anyway (the request thread only reads its head).
    const fileSha256 = "remote" in msg.input && input.bytes ? createHash("sha256").update(input.bytes).digest("hex") : undefined;
    const result = await analyse(input, (fraction, stage) => port.postMessage({ id, type: "progress", fraction, stage }));
    port.postMessage({ id, type: "result", result: fileSha256 ? { ...result, fileSha256 } : result, retire: shouldRetire() });
  } catch (e) {
    const err = e as { name?: string; code?: string; message?: string };
    port.postMessage({ id, type: "error", error: { name: err?.name ?? "Error", code: err?.code ?? "internal", message: err?.message ?? String(e) }, retire: shouldRetire() });
  }
}

port.on("message", (msg: WorkerMessage) => void handle(msg));

/** A stored file fetched here, off the request thread, and given the upload content check. */
async function fetched<T extends { remote: RemoteFile; fileName: string }>(input: T): Promise<Omit<T, "remote"> & { bytes: Uint8Array }> {
  const { remote, ...rest } = input;
  const bytes = await fetchModelBytes(remote.url, { maxBytes: remote.maxBytes, timeoutMs: remote.timeoutMs });
  const check = checkModelUpload(bytes, rest.fileName);
  if (!check.ok) throw new EstimateInputError("file:type", check.message);
  return { ...rest, bytes };
}

/** Every k-th triangle, so that at most `max` remain (the preview only; the estimate reads all). */
function thinned(positions: Float32Array, max: number | undefined): Float32Array {
  const tris = positions.length / 9;
  if (!max || tris <= max) return positions;
  const k = Math.ceil(tris / max);
  const out = new Float32Array(Math.floor(tris / k) * 9);
  for (let t = 0, o = 0; o < out.length; t += k, o += 9) out.set(positions.subarray(t * 9, t * 9 + 9), o);
  return out;
}

function shouldRetire(): boolean {
  const heap = loadedOcctHeapBytes();
  return heap !== null && heap > RETIRE_ABOVE_BYTES;
}

/**
 * Run the analysis at the lowest CPU priority, so web requests on the main thread are served
 * first when the cores are busy. Linux keeps a nice value per thread: /proc/thread-self names
 * this thread's id, which setpriority(2) accepts. Elsewhere the worker keeps normal priority.
 */
function lowerThreadPriority(): void {
  if (process.env.ESTIMATE_WORKER_NICE === "0") return;
  try {
    const tid = Number(readlinkSync("/proc/thread-self").split("/").pop());
    if (Number.isInteger(tid) && tid > 0) setPriority(tid, Number(process.env.ESTIMATE_WORKER_NICE ?? 19));
  } catch {
    // Not Linux, or not allowed: normal priority.
  }
}
