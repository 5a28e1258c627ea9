import { build } from "esbuild";
import path from "node:path";

/**
 * Bundles the estimate worker into one standalone ES module, .worker/estimate-worker.mjs, which
 * lib/estimating/pool.ts starts in worker threads (the app's own bundler never sees it).
 */
const root = path.resolve(import.meta.dirname, "../..");
const outfile = path.join(root, ".worker", "estimate-worker.mjs");
await build({
  entryPoints: [path.join(root, "lib/estimating/worker-entry.ts")],
  outfile,
  bundle: true,
  platform: "node",
  format: "esm",
  target: "node20",
  // the CAD kernel reader loads its own files at run time; keep it a package import
  external: ["occt-import-js"],
  banner: { js: "import { createRequire as __cr } from 'node:module'; const require = __cr(import.meta.url);" },
  logLevel: "warning",
});
console.log(`estimate worker: ${path.relative(root, outfile)}`);
