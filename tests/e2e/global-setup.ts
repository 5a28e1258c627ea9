import { spawnSync } from "node:child_process";
import { existsSync } from "node:fs";
import path from "node:path";

/** E2E_DIST_DIR picks another build folder (each engineer may keep their own). */
export const E2E_DIST_DIR = process.env.E2E_DIST_DIR || ".next-e2e";

/** Build the production app once for all browser tests (E2E_SKIP_BUILD=1 reuses the last build). */
export default function setup() {
  const root = path.resolve(import.meta.dirname, "../..");
  if (process.env.E2E_SKIP_BUILD === "1" && existsSync(path.join(root, E2E_DIST_DIR, "BUILD_ID"))) return;
  const started = Date.now();
  const r = spawnSync("npm", ["run", "build"], {
    cwd: root,
    stdio: "inherit",
    env: { ...process.env, NEXT_DIST_DIR: E2E_DIST_DIR, NEXT_TELEMETRY_DISABLED: "1" },
  });
  if (r.status !== 0) throw new Error("next build failed; see the output above");
  console.log(`production build for browser tests: ${((Date.now() - started) / 1000).toFixed(0)} s`);
}
