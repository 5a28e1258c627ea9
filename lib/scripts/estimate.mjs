/**
 * `npm run estimate -- FILE [options]`: the estimate command line as compiled JavaScript. Runs
 * .worker/estimate-cli.mjs (lib/estimating/cli.ts bundled by esbuild), bundling it first when it
 * is missing or one of its sources changed since (about a second, once), so it works straight
 * after `npm ci` and after every edit with no separate build step. Plain JavaScript, so no
 * TypeScript runner starts: a run costs Node's own start plus the engine's work.
 *
 * package.json starts it with V8's optimizing compiler on the main thread
 * (--no-concurrent-recompilation --no-concurrent-osr): each of the engine's long loops runs once
 * per file, and waiting a few milliseconds for its optimized code beats running on in the
 * interpreter while a background compile waits for a core (the second core is the slicing
 * helper's, lib/estimating/slice-ahead.ts). The figures are the same either way.
 */
import { ensureBundle } from "./engine-bundles.mjs";

const file = await ensureBundle("cli");
await import(file);
