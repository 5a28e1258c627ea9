import { createServer } from "node:http";
import type { AddressInfo } from "node:net";

export interface ReceivedWebhook {
  body: string;
  headers: Record<string, string | string[] | undefined>;
}

/**
 * A tiny HTTP endpoint for tests: records every POST and answers with the status `respond`
 * returns (200 unless told otherwise).
 */
export async function startWebhookSink(respond: (n: number, hook: ReceivedWebhook) => number = () => 200) {
  const received: ReceivedWebhook[] = [];
  const waiters: { count: number; resolve: () => void }[] = [];
  const server = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on("data", (c: Buffer) => chunks.push(c));
    req.on("end", () => {
      const hook = { body: Buffer.concat(chunks).toString("utf8"), headers: req.headers };
      received.push(hook);
      const status = respond(received.length, hook);
      res.writeHead(status, { "content-type": "application/json" });
      res.end(JSON.stringify({ received: status < 300 }));
      for (const w of waiters.filter((w) => received.length >= w.count)) w.resolve();
    });
  });
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", () => r()));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}/hook`,
    received,
    /** Resolve when at least `count` requests have arrived (or reject after `ms`). */
    waitFor(count: number, ms = 10_000): Promise<void> {
      if (received.length >= count) return Promise.resolve();
      return new Promise((resolve, reject) => {
        const t = setTimeout(() => reject(new Error(`expected ${count} webhook(s), got ${received.length}`)), ms);
        waiters.push({ count, resolve: () => (clearTimeout(t), resolve()) });
      });
    },
    close: () => new Promise<void>((r) => { server.closeAllConnections(); server.close(() => r()); }),
  };
}
