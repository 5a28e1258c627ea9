import { readFileSync } from "node:fs";
import { availableParallelism, loadavg } from "node:os";
import { Worker } from "node:worker_threads";
import type { IndexedMesh } from "./indexed";
import { slice, type Sections, type SliceInto } from "./slice";
import type { Axis } from "./types";

/**
 * Slicing on a second thread while the first measures. The fine cross-sections along each up
 * axis the search will plan (stages/slice) need only the mesh and its box, so they can be cut
 * while the welding and the edge topology run; with a core to spare, both are done at once.
 *
 * Nothing is copied: the mesh's arrays live in shared memory (the streaming STL reader puts them
 * there) and the helper writes each job's sections into shared arrays too. Both threads claim
 * jobs from a shared counter: the helper from the start, the caller once it has measured. The
 * caller never waits on a helper that is starved of a core: a job the helper is on is waited for
 * only while it is more than half done and moving; otherwise the caller cuts it too. The cuts are
 * the same code on the same memory, so the sections are the same bits as cut in line.
 */

/** One fine slicing: the planes z0 + (k + ½)·h, k < count, across the `up` axis. */
export interface SliceJob { up: Axis; z0: number; h: number; count: number }

export interface SlicesAhead {
  /** The sections of every job, in the jobs' order: cutting here those the helper has not done. */
  finish(): Sections[];
}

export interface SliceAhead {
  /** Starts cutting `jobs` beside the caller, or null when it cannot (no core to spare, or the mesh is not in shared memory). */
  start(mesh: IndexedMesh, jobs: SliceJob[]): SlicesAhead | null;
}

/** What the helper thread is sent: the mesh's shared memory, the jobs, their shared state and sections. */
export interface SliceMessage {
  vertices: Float32Array;
  indices: Uint32Array;
  vertexCount: number;
  triangleCount: number;
  jobs: SliceJob[];
  /** Int32 words: [0] the next job to claim; job j's state at 1 + 2j (CUTTING, DONE, FAILED) and planes done at 2 + 2j. */
  state: Int32Array;
  /** Each job's sections, in shared memory. */
  out: Omit<SliceInto, "progress">[];
}

export const CUTTING = 0, DONE = 1, FAILED = 2;
/** A helper whose job has not moved a plane for this long is taken as starved (or gone): the caller cuts the job itself. */
const STALLED_MS = 40;

/** Claims the next job from the shared counter, or −1 when all are taken. */
export function claimJob(state: Int32Array, jobs: number): number {
  const j = Atomics.add(state, 0, 1);
  return j < jobs ? j : -1;
}

export function sliceJob(mesh: IndexedMesh, job: SliceJob, into?: SliceInto): Sections {
  return slice(mesh, job.z0, job.h, job.count, job.up, into);
}

const isShared = (a: ArrayBufferView) => typeof SharedArrayBuffer !== "undefined" && a.buffer instanceof SharedArrayBuffer;

/** The machine's idle and total CPU time so far (Linux: /proc/stat, in clock ticks), or null elsewhere. */
export function cpuTicks(): { idle: number; total: number } | null {
  try {
    const f = readFileSync("/proc/stat", "latin1");
    const v = f.slice(0, f.indexOf("\n")).trim().split(/\s+/).slice(1, 9).map(Number);
    return { idle: v[3]! + v[4]!, total: v.reduce((a, b) => a + b, 0) };
  } catch {
    return null;
  }
}

/**
 * Whether a slicing helper may pay here: two cores or more, and a core not taken by other work
 * right now (Linux: the runnable tasks of /proc/loadavg, this one included; elsewhere the
 * 1-minute load average, which lags by a minute). A helper on a machine with no core to spare
 * only costs its start (about 10 MB and a few tens of ms of CPU).
 */
export function helperMayPay(): boolean {
  const cores = availableParallelism();
  if (cores < 2) return false;
  try {
    const running = Number(readFileSync("/proc/loadavg", "latin1").split(" ")[3]!.split("/")[0]);
    if (Number.isFinite(running)) return running - 1 < cores;
  } catch {
    // not Linux
  }
  return loadavg()[0]! < cores;
}

/**
 * A helper thread running `workerFile` (the bundle of ./slice-worker), started now so that it is
 * ready by the time the mesh is read. It never keeps the process alive; `close` ends it. It is
 * given work only when the machine had a core to spare meanwhile (or `always`): on a busy machine
 * a second thread only contends with the first, so the caller slices in line.
 */
export function sliceThread(workerFile: string | URL, opts: { always?: boolean } = {}): SliceAhead & { close(): void } {
  const worker = new Worker(workerFile);
  worker.unref();
  let broken = false;
  worker.on("error", () => { broken = true; });
  worker.on("exit", () => { broken = true; });
  const since = cpuTicks();
  const cores = availableParallelism();

  /** Was a core idle, on the whole, since the helper started (the caller busy on one)? */
  const coreToSpare = (): boolean => {
    if (cores < 2) return false;
    const now = cpuTicks();
    if (!since || !now || now.total - since.total < 10) return loadavg()[0]! < cores - 0.5;
    return (now.idle - since.idle) / (now.total - since.total) >= 0.5 / cores;
  };

  return {
    start(mesh, jobs) {
      if (broken || jobs.length === 0 || !isShared(mesh.vertices) || !isShared(mesh.indices) || !(opts.always || coreToSpare())) return null;
      const state = new Int32Array(new SharedArrayBuffer(4 * (1 + 2 * jobs.length)));
      const out = jobs.map((j) => ({
        area: new Float64Array(new SharedArrayBuffer(8 * j.count)),
        perimeter: new Float64Array(new SharedArrayBuffer(8 * j.count)),
        segments: new Uint32Array(new SharedArrayBuffer(4 * j.count)),
      }));
      const message: SliceMessage = { vertices: mesh.vertices, indices: mesh.indices, vertexCount: mesh.vertexCount, triangleCount: mesh.triangleCount, jobs, state, out };
      worker.postMessage(message);
      return {
        finish() {
          const cut: (Sections | undefined)[] = jobs.map(() => undefined);
          // the jobs the helper has not claimed, cut here
          for (let j = claimJob(state, jobs.length); j >= 0; j = claimJob(state, jobs.length)) cut[j] = sliceJob(mesh, jobs[j]!);
          return jobs.map((job, j) => {
            const own = cut[j];
            if (own) return own;
            for (;;) {
              const s = Atomics.load(state, 1 + 2 * j);
              if (s === DONE) return { z0: job.z0, layerHeight: job.h, count: job.count, ...out[j]! };
              const planes = Atomics.load(state, 2 + 2 * j);
              // failed, or not yet half done: cut here rather than wait
              if (s === FAILED || planes * 2 < job.count) return sliceJob(mesh, job);
              Atomics.wait(state, 1 + 2 * j, CUTTING, STALLED_MS);
              if (Atomics.load(state, 1 + 2 * j) === CUTTING && Atomics.load(state, 2 + 2 * j) === planes) return sliceJob(mesh, job);
            }
          });
        },
      };
    },
    close() {
      void worker.terminate();
    },
  };
}
