/**
 * `npm run estimate -- FILE [options]`: the estimate command line as compiled JavaScript. Runs
 * .worker/estimate-cli.mjs (lib/estimating/cli.ts bundled by esbuild), bundling it first when it
 * is missing or one of its sources changed since (about a second, once), so it works straight
 * after `npm ci` and after every edit with no separate build step. Plain JavaScript, so no
 * TypeScript runner starts: a run costs Node's own start plus the engine's work.
 */
import { ensureBundle } from "./engine-bundles.mjs";

const file = await ensureBundle("cli");
await import(file);
