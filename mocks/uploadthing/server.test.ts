import { existsSync, mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { createRouteHandler, createUploadthing, UTApi, UTFile } from "uploadthing/server";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { resetEnvCache } from "../../lib/env";
import { LOCAL_UPLOADTHING_TOKEN } from "../../lib/uploads/token";
import { fetchUploadedFile, resetUtApi, uploadthingSettings } from "../../lib/uploads/uploadthing";
import { serveFetchHandler } from "../test-support/fetch-server";
import { sign } from "./protocol";
import { startUploadthingFake, type UploadthingFake } from "./server";

type Completed = { key: string; ufsUrl: string; name: string; size: number; metadata: unknown };
type Presigned = { url: string; key: string; name: string; customId: string | null };

/** A binary STL of one triangle (80-byte header, count, one 50-byte facet): 134 bytes. */
function tinyStl(): Uint8Array<ArrayBuffer> {
  const buf = new Uint8Array(134);
  new DataView(buf.buffer).setUint32(80, 1, true);
  return buf;
}

function makeRouter(completed: Completed[]) {
  const f = createUploadthing();
  return {
    mesh: f({ blob: { maxFileSize: "4MB", maxFileCount: 2 } })
      .middleware(() => ({ orgId: "org_caldrith", userId: "u_1" }))
      .onUploadComplete(({ file, metadata }) => {
        completed.push({ key: file.key, ufsUrl: file.ufsUrl, name: file.name, size: file.size, metadata });
        return { recordedAs: `file_${file.key.slice(0, 6)}` };
      }),
  };
}

/** What @uploadthing/react does in the browser, with fetch in place of XHR. */
async function browserUpload(
  appUrl: string,
  file: { name: string; bytes: Uint8Array<ArrayBuffer>; type: string },
): Promise<{ status: number; body: Record<string, unknown>; presigned: Presigned | null }> {
  const start = await fetch(`${appUrl}/api/uploadthing?actionType=upload&slug=mesh`, {
    method: "POST",
    headers: { "content-type": "application/json", "x-uploadthing-package": "@uploadthing/react", "x-uploadthing-version": "7.7.4" },
    body: JSON.stringify({ files: [{ name: file.name, size: file.bytes.length, type: file.type, lastModified: Date.now() }], input: null }),
  });
  const startBody = (await start.json()) as unknown;
  if (!start.ok) return { status: start.status, body: startBody as Record<string, unknown>, presigned: null };
  const presigned = (startBody as Presigned[])[0]!;
  const head = await fetch(presigned.url, { method: "HEAD" });
  expect(head.headers.get("x-ut-range-start")).toBe("0");
  const form = new FormData();
  form.append("file", new Blob([file.bytes], { type: file.type }), file.name);
  const put = await fetch(presigned.url, { method: "PUT", headers: { range: "bytes=0-", "x-uploadthing-version": "7.7.4" }, body: form });
  return { status: put.status, body: (await put.json()) as Record<string, unknown>, presigned };
}

describe("UploadThing fake with the real server SDK", () => {
  let dir: string;
  let fake: UploadthingFake;
  let app: Awaited<ReturnType<typeof serveFetchHandler>>;
  let devApp: Awaited<ReturnType<typeof serveFetchHandler>>;
  const completed: Completed[] = [];
  const devCompleted: Completed[] = [];
  let utapi: UTApi;

  beforeAll(async () => {
    dir = mkdtempSync(path.join(tmpdir(), "lw-ut-"));
    fake = await startUploadthingFake({ port: 0, token: LOCAL_UPLOADTHING_TOKEN, dataDir: dir, maxFileBytes: 100_000, log: () => {} });
    const local = new URL(fake.url);
    process.env.UPLOADTHING_INGEST_URL = fake.url;
    process.env.UPLOADTHING_UFS_HOST = `localhost:${local.port}`;
    delete process.env.UPLOADTHING_TOKEN;
    resetEnvCache();
    resetUtApi();
    const settings = uploadthingSettings();
    const common = { token: settings.token, ingestUrl: fake.url, logLevel: "Error" as const };
    app = await serveFetchHandler(createRouteHandler({ router: makeRouter(completed), config: { ...common, isDev: false, handleDaemonPromise: "await" } }));
    devApp = await serveFetchHandler(createRouteHandler({ router: makeRouter(devCompleted), config: { ...common, isDev: true, handleDaemonPromise: "void" } }));
    utapi = new UTApi({ token: settings.token, apiUrl: fake.url, ingestUrl: fake.url, ufsHost: settings.ufsHost, ufsAppIdLocation: "path", logLevel: "Error" });
  });
  afterAll(async () => {
    await app.close();
    await devApp.close();
    await fake.close();
    rmSync(dir, { recursive: true, force: true });
    for (const k of ["UPLOADTHING_INGEST_URL", "UPLOADTHING_UFS_HOST"]) delete process.env[k];
    resetEnvCache();
    resetUtApi();
  });

  it("round trip: presigned PUT on the fake's ingest, signed callback to the route handler, server data back", async () => {
    const bytes = tinyStl();
    const up = await browserUpload(app.url, { name: "drill-fixture.stl", bytes, type: "model/stl" });
    expect(up.status).toBe(200);
    const key = up.presigned!.key;
    expect(up.body).toMatchObject({ key, name: "drill-fixture.stl", size: 134, serverData: { recordedAs: `file_${key.slice(0, 6)}` } });
    expect(up.body.ufsUrl).toBe(`${fake.url}/f/${key}`);
    // onUploadComplete only runs after createRouteHandler verified the fake's HMAC signature.
    expect(completed).toEqual([{ key, ufsUrl: `${fake.url}/f/${key}`, name: "drill-fixture.stl", size: 134, metadata: { orgId: "org_caldrith", userId: "u_1" } }]);
    expect(new Uint8Array(readFileSync(path.join(dir, "uploads", key)))).toEqual(bytes);
    const served = await fetch(String(up.body.ufsUrl));
    expect(new Uint8Array(await served.arrayBuffer())).toEqual(bytes);
    expect(await fetchUploadedFile(String(up.body.ufsUrl))).toEqual(bytes);
  });

  it("works in dev mode too (the SDK reads callbacks from the metadata stream and forwards them)", async () => {
    const up = await browserUpload(devApp.url, { name: "hull-plug.stl", bytes: tinyStl(), type: "model/stl" });
    expect(up.status).toBe(200);
    expect(up.body.serverData).toMatchObject({ recordedAs: expect.stringMatching(/^file_/) });
    expect(devCompleted.map((c) => c.name)).toEqual(["hull-plug.stl"]);
  });

  it("the route handler refuses a callback whose signature is wrong", async () => {
    const payload = JSON.stringify({ status: "uploaded", file: { key: "k", name: "n", size: 1, type: "t", customId: null, url: "u", appUrl: "u", ufsUrl: "u", fileHash: "h" }, origin: fake.url, metadata: {} });
    const forged = await fetch(`${app.url}/api/uploadthing?slug=mesh`, {
      method: "POST",
      headers: { "content-type": "application/json", "uploadthing-hook": "callback", "x-uploadthing-signature": sign(payload, "sk_wrong_key") },
      body: payload,
    });
    expect(forged.status).toBe(400);
    expect(completed.some((c) => c.key === "k")).toBe(false);
  });

  it("refuses an upload over the size limit, a tampered URL and path traversal in keys", async () => {
    const big = await browserUpload(app.url, { name: "too-big.stl", bytes: new Uint8Array(150_000), type: "model/stl" });
    expect(big.status).toBe(413);
    expect(String(big.body.error)).toContain("limit is 100000 bytes");
    expect(existsSync(path.join(dir, "uploads", big.presigned!.key))).toBe(false);

    const start = await fetch(`${app.url}/api/uploadthing?actionType=upload&slug=mesh`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ files: [{ name: "a.stl", size: 10, type: "model/stl" }], input: null }),
    });
    const [p] = (await start.json()) as Presigned[];
    const tampered = p!.url.replace("x-ut-file-size=10", "x-ut-file-size=99");
    expect((await fetch(tampered, { method: "PUT", body: new Uint8Array(99) })).status).toBe(403);
    const traversal = p!.url.replace(`/${p!.key}?`, "/..%2F..%2Fetc%2Fpasswd?");
    expect((await fetch(traversal, { method: "PUT", body: new Uint8Array(10) })).status).toBe(400);
    expect((await fetch(`${fake.url}/f/..%2Fstripe-fake.json`)).status).toBe(400);
    expect((await fetch(`${fake.url}/f/nosuchkey`)).status).toBe(404);
  });

  it("UTApi.uploadFiles and deleteFiles work against the fake; private files need a signed URL", async () => {
    const res = await utapi.uploadFiles(new UTFile([tinyStl()], "seed-mold.stl"));
    expect(res.error).toBeNull();
    const key = res.data!.key;
    expect(res.data).toMatchObject({ name: "seed-mold.stl", size: 134, ufsUrl: `${fake.url}/f/${key}` });
    expect(existsSync(path.join(dir, "uploads", key))).toBe(true);

    const priv = await utapi.uploadFiles(new UTFile([tinyStl()], "controlled.stl"), { acl: "private" });
    expect(priv.error).toBeNull();
    expect((await fetch(priv.data!.ufsUrl)).status).toBe(403);
    expect((await fetchUploadedFile(priv.data!.ufsUrl, { utApi: utapi })).length).toBe(134);
    await expect(fetchUploadedFile(priv.data!.ufsUrl, { utApi: utapi, maxBytes: 100 })).rejects.toThrow(/larger than 100 bytes/);
    await expect(fetchUploadedFile("http://169.254.169.254/f/abc")).rejects.toThrow(/Refusing to read files/);

    const del = await utapi.deleteFiles([key, priv.data!.key]);
    expect(del).toMatchObject({ success: true, deletedCount: 2 });
    expect(existsSync(path.join(dir, "uploads", key))).toBe(false);
    expect((await fetch(`${fake.url}/f/${key}`)).status).toBe(404);
  });
});
