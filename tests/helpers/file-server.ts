import { createServer, type Server } from "node:http";
import type { AddressInfo } from "node:net";

/**
 * A tiny stand-in for file storage in integration tests: serves `files` by key at `${base}/<key>`
 * (404 otherwise), so code that fetches by a signed URL can run against known bytes.
 */
export async function startFileServer(files: Map<string, Uint8Array>): Promise<{ base: string; close: () => Promise<void> }> {
  const server: Server = createServer((req, res) => {
    const body = files.get((req.url ?? "").slice(1));
    if (!body) return void res.writeHead(404).end();
    res.writeHead(200, { "content-length": body.length }).end(Buffer.from(body));
  });
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
  return {
    base: `http://127.0.0.1:${(server.address() as AddressInfo).port}`,
    close: () => new Promise((r) => server.close(() => r())),
  };
}
