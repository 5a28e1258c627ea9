import { spawnSync } from "node:child_process";
import path from "node:path";
import { describe, expect, it } from "vitest";

const root = path.resolve(__dirname, "../..");

/**
 * The demo, the load and fault runs and the hardening stack run the seed and these scripts under
 * plain Node (tsx), where `import "server-only"` throws (vitest resolves it to nothing, so the other
 * tests cannot see it). A query module the seed reaches must go without the marker.
 */
describe("the seed and the run scripts load under plain Node", () => {
  it("imports them in a tsx child process with no server-only module reached", () => {
    const modules = ["lib/seed/seed.ts", "lib/scripts/hard-stack.ts", "lib/scripts/faults-core.ts", "lib/scripts/load-report.ts"];
    const script = `for (const m of ${JSON.stringify(modules)}) await import(${JSON.stringify(root + "/")} + m); console.log("loaded");`;
    const run = spawnSync(path.join(root, "node_modules/.bin/tsx"), ["--eval", script, "--input-type=module"], { cwd: root, encoding: "utf8", timeout: 60_000 });
    // the first error line names what went wrong (server-only: "cannot be imported from a Client Component")
    const why = run.stderr.split("\n").find((l) => /^\w*Error:/.test(l)) ?? run.stderr.slice(0, 300);
    expect(run.status, why).toBe(0);
    expect(run.stdout.trim().split("\n").pop()).toBe("loaded");
  }, 90_000);
});
