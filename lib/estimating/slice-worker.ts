import { parentPort } from "node:worker_threads";
import type { IndexedMesh } from "./indexed";
import { claimJob, DONE, FAILED, sliceJob, type SliceMessage } from "./slice-ahead";

/**
 * Worker-thread entry of the slicing helper (./slice-ahead), bundled on its own into
 * .worker/slice-worker.mjs by lib/scripts/engine-bundles.mjs. It reads the mesh in the shared
 * memory it is sent, cuts the jobs it claims into the shared sections, and marks each done (or
 * failed: the caller then cuts it) with the planes done as it goes.
 */
if (!parentPort) throw new Error("the slicing helper must run in a worker thread");

// The schedule's time-zone arithmetic (Intl, on the main thread, once the sections are in) first
// loads ICU's zone and calendar data, about 30 ms; ICU keeps it for the whole process, so it is
// loaded here, while the main thread still reads the file.
new Intl.DateTimeFormat("en-US", { timeZone: "CST6CDT", hourCycle: "h23", year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit", second: "2-digit" }).formatToParts(0);

parentPort.on("message", (msg: SliceMessage) => {
  const { state, jobs } = msg;
  const mesh: IndexedMesh = { vertices: msg.vertices, indices: msg.indices, vertexCount: msg.vertexCount, triangleCount: msg.triangleCount };
  for (let j = claimJob(state, jobs.length); j >= 0; j = claimJob(state, jobs.length)) {
    const at = 1 + 2 * j;
    try {
      sliceJob(mesh, jobs[j]!, { ...msg.out[j]!, progress: (k) => Atomics.store(state, at + 1, k) });
      Atomics.store(state, at, DONE);
    } catch {
      Atomics.store(state, at, FAILED);
    }
    Atomics.notify(state, at);
  }
});
