/**
 * `npm test`: lint, type-check, then vitest's unit, integration and browser projects, and one
 * closing line `tests: N passed, M failed` counted from vitest's JSON report. Exits non-zero on
 * any failure. `TEST_ONLY=unit,integration` narrows the vitest projects.
 */
import { spawnSync } from "node:child_process";
import { mkdirSync, readFileSync, rmSync } from "node:fs";
import path from "node:path";

const root = path.resolve(import.meta.dirname, "../..");
const bin = (name: string) => path.join(root, "node_modules/.bin", name);
const failures: string[] = [];

function step(label: string, cmd: string, args: string[]) {
  const started = Date.now();
  console.log(`\n── ${label} ──`);
  const r = spawnSync(cmd, args, { cwd: root, stdio: "inherit", env: process.env });
  const secs = ((Date.now() - started) / 1000).toFixed(1);
  if (r.status !== 0) {
    failures.push(label);
    console.log(`── ${label}: FAILED (${secs} s)`);
  } else {
    console.log(`── ${label}: ok (${secs} s)`);
  }
}

if (!process.env.SKIP_STATIC) {
  // Two lint threads: the type-aware rules build a program per thread, and lint runs alone here.
  step("lint", bin("eslint"), [".", "--max-warnings=0", "--concurrency=2"]);
  step("typecheck", bin("tsc"), ["--noEmit"]);
}

const projects = (process.env.TEST_ONLY ?? "unit,integration,e2e").split(",").filter(Boolean);
const reportDir = path.join(root, "test-results");
rmSync(reportDir, { recursive: true, force: true });
mkdirSync(reportDir, { recursive: true });

let passed = 0;
let failed = 0;
for (const project of projects) {
  const report = path.join(reportDir, `${project}.json`);
  step(`vitest ${project}`, bin("vitest"), ["run", "--project", project, "--reporter=default", "--reporter=json", `--outputFile.json=${report}`]);
  try {
    const json = JSON.parse(readFileSync(report, "utf8")) as { numPassedTests: number; numFailedTests: number; numTotalTestSuites: number; testResults: { status: string }[] };
    passed += json.numPassedTests;
    failed += json.numFailedTests;
    // A test file that failed to load counts as a failure even with no failed test inside.
    failed += json.testResults.filter((f) => f.status === "failed").length && json.numFailedTests === 0 ? 1 : 0;
  } catch {
    failed += 1;
    console.log(`no report from vitest ${project}`);
  }
}

const staticFailures = failures.filter((f) => !f.startsWith("vitest")).length;
console.log(`\nsteps failed: ${failures.length ? failures.join(", ") : "none"}`);
console.log(`tests: ${passed} passed, ${failed + staticFailures} failed`);
process.exit(failures.length || failed ? 1 : 0);
