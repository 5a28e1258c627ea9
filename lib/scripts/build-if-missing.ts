import { spawnSync } from "node:child_process";
import { existsSync } from "node:fs";
import path from "node:path";
import { root } from "./stack";

/** Build the production app (and the estimate worker) into `distDir` unless a build is there. */
export function buildIfMissingFor(distDir: string): void {
  if (existsSync(path.join(root, distDir, "BUILD_ID"))) return;
  console.log(`building into ${distDir} …`);
  const r = spawnSync("npm", ["run", "build"], { cwd: root, stdio: "inherit", env: { ...process.env, NEXT_DIST_DIR: distDir, NEXT_TELEMETRY_DISABLED: "1" } });
  if (r.status !== 0) throw new Error("build failed");
}
