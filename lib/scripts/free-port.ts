import net from "node:net";

/** A port that was free a moment ago on loopback. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.unref();
    server.on("error", reject);
    server.listen(0, "127.0.0.1", () => {
      const address = server.address();
      const port = typeof address === "object" && address ? address.port : 0;
      server.close(() => resolve(port));
    });
  });
}

/** Wait until an HTTP URL answers (any status), or fail after `timeoutMs`. */
export async function waitForHttp(url: string, timeoutMs = 60_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  let lastError: unknown;
  while (Date.now() < deadline) {
    try {
      // No kept-alive socket is left behind: the server closes an idle one after 5 s, and the
      // caller's next fetch could be handed it just as it closes (ECONNRESET).
      const res = await fetch(url, { redirect: "manual", headers: { connection: "close" } });
      await res.arrayBuffer();
      return;
    } catch (e) {
      lastError = e;
      await new Promise((r) => setTimeout(r, 250));
    }
  }
  throw new Error(`${url} did not answer within ${timeoutMs} ms: ${String(lastError)}`);
}
