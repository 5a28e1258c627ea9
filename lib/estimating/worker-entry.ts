import { parentPort } from "node:worker_threads";
import { analyse, type AnalyseInput } from "./analyse";

/**
 * Worker-thread entry of the estimate pool. Bundled on its own by lib/scripts/build-worker.ts into
 * .worker/estimate-worker.mjs (the app's bundler never sees it). Messages:
 * in  { id, input }; out { id, type: "progress", fraction, stage } | { id, type: "result", result }
 * | { id, type: "error", error: { name, code, message } }.
 */
if (!parentPort) throw new Error("estimate worker must run in a worker thread");
const port = parentPort;
port.on("message", async (msg: { id: number; input: AnalyseInput }) => {
  const { id, input } = msg;
  try {
    const result = await analyse(input, (fraction, stage) => port.postMessage({ id, type: "progress", fraction, stage }));
    port.postMessage({ id, type: "result", result });
  } catch (e) {
    const err = e as { name?: string; code?: string; message?: string };
    port.postMessage({ id, type: "error", error: { name: err?.name ?? "Error", code: err?.code ?? "internal", message: err?.message ?? String(e) } });
  }
});
