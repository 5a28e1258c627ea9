import path from "node:path";
import { buildBundle, root } from "./engine-bundles.mjs";

/**
 * Bundles the estimate worker (.worker/estimate-worker.mjs, started in worker threads by
 * lib/estimating/pool.ts; the app's own bundler never sees it) and the estimate command line
 * (.worker/estimate-cli.mjs, run by `npm run estimate`) with its slicing helper thread
 * (.worker/slice-worker.mjs). Part of `npm run build`.
 */
for (const name of ["worker", "cli", "slicer"] as const) {
  const outfile = await buildBundle(name);
  console.log(`estimate ${name}: ${path.relative(root, outfile)}`);
}
