/** Fault scenarios: the app server killed during uploads, and an upload store that is full or read-only (see faults-core.ts). */
import { setTimeout as sleep } from "node:timers/promises";
import { execFileSync } from "node:child_process";
import { cpSync, mkdirSync, renameSync, rmSync } from "node:fs";
import path from "node:path";
import { binaryStl, box, layupMold } from "../../mocks/fixtures/meshes";
import type { HardStack } from "./hard-stack";
import type { Session } from "./http-client";
import { checkDatabase, signedIn, type CheckReport } from "./faults-core";

/** The browser's upload protocol (@uploadthing/react) by fetch, signed in. */
export async function uploadFile(session: Session, name: string, bytes: Uint8Array): Promise<{ status: number; body: Record<string, unknown> }> {
  const start = await session.fetch("/api/uploadthing?actionType=upload&slug=model", {
    method: "POST",
    headers: { "content-type": "application/json", "x-uploadthing-package": "@uploadthing/react", "x-uploadthing-version": "7.7.4" },
    body: JSON.stringify({ files: [{ name, size: bytes.length, type: "model/stl", lastModified: Date.now() }], input: null }),
  });
  const startBody = (await start.json()) as unknown;
  if (!start.ok) return { status: start.status, body: startBody as Record<string, unknown> };
  const presigned = (startBody as { url: string; key: string }[])[0]!;
  const form = new FormData();
  form.append("file", new Blob([new Uint8Array(bytes)], { type: "model/stl" }), name);
  const put = await fetch(presigned.url, { method: "PUT", headers: { range: "bytes=0-", "x-uploadthing-version": "7.7.4" }, body: form });
  const text = await put.text();
  let body: Record<string, unknown>;
  try {
    body = JSON.parse(text) as Record<string, unknown>;
  } catch {
    body = { text };
  }
  return { status: put.status, body: { ...body, key: presigned.key } };
}

export interface UploadFaultFigures {
  started: number;
  completedBeforeKill: number;
  rowsAfter: number;
  check: CheckReport;
}

/** Several uploads in flight when the server is killed: no upload row without its stored file. */
export async function uploadFault(stack: HardStack, opts: { uploads: number; killAfterMs: number }): Promise<UploadFaultFigures> {
  const since = Date.now();
  const session = await signedIn(stack, "engineer@caldrith.example", "demo-client-2026");
  const bytes = binaryStl(layupMold(160, 80));
  const before = await checkDatabase(stack.dbUrl, stack.dataDir, since);
  let completed = 0;
  const inFlight = Array.from({ length: opts.uploads }, async (_, i) => {
    await sleep(i * 20);
    try {
      const r = await uploadFile(session, `fault-${i}.stl`, bytes);
      if (r.status === 200 && !r.body.error) completed += 1;
    } catch {
      /* dropped by the kill */
    }
  });
  await sleep(opts.killAfterMs);
  await stack.killApp();
  const completedBeforeKill = completed;
  await Promise.allSettled(inFlight);
  await stack.restartApp();
  const check = await checkDatabase(stack.dbUrl, stack.dataDir, since);
  return { started: opts.uploads, completedBeforeKill, rowsAfter: check.counts.uploads! - before.counts.uploads!, check };
}

export interface DiskFaultFigures {
  mode: "full" | "read-only";
  status: number;
  message: string;
  rowsAdded: number;
  recoveredStatus: number;
  check: CheckReport;
}

/** Mount a small tmpfs over the upload store (keeping its files); null when mounting is not allowed here. */
export function mountSmallStore(dataDir: string, sizeKb: number): { remount: (mode: "ro" | "rw") => void; unmount: () => void } | null {
  const store = path.join(dataDir, "uploads");
  const keep = path.join(dataDir, "uploads-before-mount");
  renameSync(store, keep);
  mkdirSync(store);
  try {
    execFileSync("mount", ["-t", "tmpfs", "-o", `size=${sizeKb}k`, "tmpfs", store], { stdio: "ignore" });
  } catch {
    rmSync(store, { recursive: true, force: true });
    renameSync(keep, store);
    return null;
  }
  cpSync(keep, store, { recursive: true });
  return {
    remount: (mode) => execFileSync("mount", ["-o", `remount,${mode}`, store], { stdio: "ignore" }),
    unmount: () => {
      execFileSync("umount", [store], { stdio: "ignore" });
      rmSync(store, { recursive: true, force: true });
      renameSync(keep, store);
    },
  };
}

/** An upload into a store that is full or read-only: a clear error, no upload row, and uploads work again once it has room. */
export async function diskFault(stack: HardStack, mode: "full" | "read-only", control: { remount: (m: "ro" | "rw") => void }): Promise<DiskFaultFigures> {
  const since = Date.now();
  const session = await signedIn(stack, "engineer@caldrith.example", "demo-client-2026");
  const before = await checkDatabase(stack.dbUrl, stack.dataDir, since);
  if (mode === "read-only") control.remount("ro");
  // Full: the store has room for its files and about 512 KiB more, not for this 3 MB part.
  const big = binaryStl(layupMold(240, 120));
  const r = await uploadFile(session, `disk-${mode}.stl`, mode === "full" ? big : binaryStl(box(100, 100, 100)));
  if (mode === "read-only") control.remount("rw");
  const afterFault = await checkDatabase(stack.dbUrl, stack.dataDir, since);
  const small = await uploadFile(session, `after-${mode}.stl`, binaryStl(box(50, 50, 50)));
  const check = await checkDatabase(stack.dbUrl, stack.dataDir, since);
  const message = String(r.body.error ?? r.body.message ?? r.body.text ?? "");
  if (small.status !== 200) check.problems.push(`the upload after the fault failed: ${JSON.stringify(small.body).slice(0, 300)}`);
  return { mode, status: r.status, message, rowsAdded: afterFault.counts.uploads! - before.counts.uploads!, recoveredStatus: small.status, check };
}
