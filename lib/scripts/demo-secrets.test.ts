import { mkdtempSync, readFileSync, rmSync, statSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { productionEnvProblems } from "../env";
import { demoSecrets } from "./demo-secrets";

const dir = mkdtempSync(path.join(os.tmpdir(), "demo-secrets-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("the demo's own secrets", () => {
  it("are random, pass the production check, and are kept (owner-only) across runs", () => {
    const first = demoSecrets(dir, "http://localhost:3000");
    expect(productionEnvProblems({ NODE_ENV: "production", ...first })).toEqual([]);
    expect(demoSecrets(dir, "http://localhost:3000")).toEqual(first);
    expect(statSync(path.join(dir, "demo-secrets.json")).mode & 0o777).toBe(0o600);
    // A moved port keeps the secrets and records the new URL.
    const moved = demoSecrets(dir, "http://localhost:5200");
    expect(moved).toEqual({ ...first, APP_URL: "http://localhost:5200" });
    expect(JSON.parse(readFileSync(path.join(dir, "demo-secrets.json"), "utf8")).APP_URL).toBe("http://localhost:5200");
    // Another data folder gets other secrets.
    const other = mkdtempSync(path.join(os.tmpdir(), "demo-secrets-"));
    expect(demoSecrets(other, "http://localhost:3000").AUTH_SECRET).not.toBe(first.AUTH_SECRET);
    rmSync(other, { recursive: true, force: true });
  });
});
