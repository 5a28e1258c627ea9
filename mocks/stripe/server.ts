import { createServer, type IncomingMessage, type ServerResponse } from "node:http";
import type { AddressInfo } from "node:net";
import { pathToFileURL } from "node:url";
import { ApiError, handleApi, publicView, type ApiContext } from "./api";
import { WebhookQueue } from "./delivery";
import { parseStripeForm } from "./form";
import { renderCheckoutPage, renderNotFoundPage } from "./page";
import { payCheckoutSession } from "./pay";
import { fundCashBalance } from "./cash-balance";
import { Store, newId, type Collection, type StripeObject } from "./store";

export interface StripeFakeOptions {
  port?: number;
  host?: string;
  /** Folder for `stripe-fake.json`; null keeps state in memory only. */
  dataDir?: string | null;
  webhookUrl?: string;
  webhookSecret?: string;
  /** Base URL the browser uses for the checkout page; defaults to the listening address. */
  publicUrl?: string;
  retryBaseMs?: number;
  maxRetryDelayMs?: number;
  log?: (line: string) => void;
}

export interface StripeFake {
  url: string;
  port: number;
  store: Store;
  close: () => Promise<void>;
}

const MAX_BODY_BYTES = 1_000_000;

async function readBody(req: IncomingMessage): Promise<string> {
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of req) {
    size += (chunk as Buffer).length;
    if (size > MAX_BODY_BYTES) throw new ApiError(413, "invalid_request_error", "Request body too large.");
    chunks.push(chunk as Buffer);
  }
  return Buffer.concat(chunks).toString("utf8");
}

function send(res: ServerResponse, status: number, body: unknown, headers: Record<string, string> = {}): void {
  const text = JSON.stringify(body, null, 2);
  res.writeHead(status, { "content-type": "application/json", "request-id": `req_${newId("secret").slice(0, 14)}`, ...headers });
  res.end(text);
}

function html(res: ServerResponse, status: number, body: string): void {
  res.writeHead(status, { "content-type": "text/html; charset=utf-8", "cache-control": "no-store", "x-frame-options": "DENY" });
  res.end(body);
}

const INJECTABLE: Collection[] = ["checkout_sessions", "payment_intents", "charges", "balance_transactions", "refunds"];
const OBJECT_NAME: Record<Collection, string> = {
  checkout_sessions: "checkout.session",
  payment_intents: "payment_intent",
  charges: "charge",
  balance_transactions: "balance_transaction",
  refunds: "refund",
  events: "event",
  customers: "customer",
  cash_balance_transactions: "customer_cash_balance_transaction",
};

/** Start the Stripe API fake. Resolves once it listens; `close()` stops delivery and the server. */
export async function startStripeFake(options: StripeFakeOptions = {}): Promise<StripeFake> {
  const log = options.log ?? ((line: string) => console.log(`[stripe-fake] ${line}`));
  const store = new Store(options.dataDir === undefined ? null : options.dataDir);
  const queue = new WebhookQueue(store, {
    webhookUrl: options.webhookUrl ?? "http://127.0.0.1:3000/api/webhooks/stripe",
    webhookSecret: options.webhookSecret ?? "whsec_layerwright_local",
    retryBaseMs: options.retryBaseMs ?? 1000,
    maxDelayMs: options.maxRetryDelayMs ?? 60_000,
    log,
  });
  const ctx: ApiContext = { store, queue, publicUrl: options.publicUrl ?? "" };

  const server = createServer((req, res) => {
    handle(req, res).catch((e: unknown) => {
      if (e instanceof ApiError) return send(res, e.status, e.toJSON());
      log(`internal error: ${(e as Error).stack ?? String(e)}`);
      send(res, 500, { error: { type: "api_error", message: "The local Stripe fake hit an internal error." } });
    });
  });

  async function handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    const url = new URL(req.url ?? "/", "http://fake.local");
    const method = req.method ?? "GET";
    const path = url.pathname;

    if (path.startsWith("/v1/")) {
      const auth = req.headers.authorization ?? "";
      const key = auth.startsWith("Bearer ") ? auth.slice(7) : auth.startsWith("Basic ") ? Buffer.from(auth.slice(6), "base64").toString().split(":")[0] : "";
      if (!key) {
        throw new ApiError(401, "invalid_request_error", "You did not provide an API key. You need to provide your API key in the Authorization header, using Bearer auth (e.g. 'Authorization: Bearer YOUR_SECRET_KEY').");
      }
      if (!/^(sk|rk)_test_/.test(key)) {
        throw new ApiError(401, "invalid_request_error", "Invalid API Key provided: the local fake accepts test-mode secret keys only (sk_test_…).", "api_key_invalid");
      }
      const raw = method === "GET" || method === "DELETE" ? url.search.slice(1) : await readBody(req);
      const idem = req.headers["idempotency-key"];
      const result = handleApi(ctx, {
        method,
        path,
        params: parseStripeForm(raw),
        rawParams: raw,
        idempotencyKey: typeof idem === "string" && idem ? idem : undefined,
      });
      return send(res, result.status, result.body, result.headers);
    }

    const page = path.match(/^\/checkout\/([A-Za-z0-9_]+)(\/pay)?$/);
    if (page) {
      const id = page[1]!;
      const session = store.get("checkout_sessions", id);
      if (!session) return html(res, 404, renderNotFoundPage());
      if (method === "GET" && !page[2]) return html(res, 200, renderCheckoutPage(session));
      if (method === "POST" && page[2]) {
        const card = new URLSearchParams(await readBody(req)).get("card") ?? "";
        const result = payCheckoutSession(ctx, id, card);
        if (result.outcome === "succeeded") {
          if (result.redirectUrl) {
            res.writeHead(303, { location: result.redirectUrl });
            return void res.end();
          }
          return html(res, 200, renderCheckoutPage(session, { notice: "Payment complete." }));
        }
        return html(res, result.outcome === "not_open" ? 409 : 402, renderCheckoutPage(session, { error: result.message }));
      }
    }

    if (path.startsWith("/_fake/")) return handleControl(method, path, req, res);

    if (path === "/" || path === "/health") return send(res, 200, { ok: true, service: "stripe-fake" });
    throw new ApiError(404, "invalid_request_error", `Unrecognized request URL (${method}: ${path}).`);
  }

  async function handleControl(method: string, path: string, req: IncomingMessage, res: ServerResponse): Promise<void> {
    const json = async (): Promise<Record<string, unknown>> => {
      const text = await readBody(req);
      if (!text) return {};
      try {
        const parsed: unknown = JSON.parse(text);
        if (parsed && typeof parsed === "object" && !Array.isArray(parsed)) return parsed as Record<string, unknown>;
      } catch {
        /* answered below */
      }
      throw new ApiError(400, "invalid_request_error", "Control endpoints take a JSON object body.");
    };
    if (method === "POST" && path === "/_fake/reset") {
      store.reset();
      return send(res, 200, { ok: true });
    }
    if (method === "GET" && path === "/_fake/events") {
      const deliveries = new Map(store.state.deliveries.map((d) => [d.eventId, d]));
      const events = store.state.objects.events.map((e) => ({ ...e, delivery: deliveries.get(e.id) ?? null }));
      return send(res, 200, { object: "list", data: events.reverse(), has_more: false });
    }
    if (method === "POST" && path === "/_fake/redeliver") {
      const body = await json();
      const id = typeof body.id === "string" ? body.id : undefined;
      if (id && !store.get("events", id)) throw new ApiError(404, "invalid_request_error", `No such event: '${id}'`, "resource_missing");
      return send(res, 200, { ok: true, queued: queue.redeliver(id) });
    }
    if (method === "POST" && path === "/_fake/objects") {
      const body = await json();
      const inserted: Record<string, StripeObject[]> = {};
      for (const collection of INJECTABLE) {
        const rows = body[collection];
        if (rows === undefined) continue;
        if (!Array.isArray(rows)) throw new ApiError(400, "invalid_request_error", `${collection} must be an array of objects.`);
        inserted[collection] = rows.map((row: unknown) => {
          if (!row || typeof row !== "object") throw new ApiError(400, "invalid_request_error", `${collection} entries must be objects.`);
          const o = { ...(row as Record<string, unknown>) };
          o.id = typeof o.id === "string" ? o.id : newId(collection);
          if (store.get(collection, String(o.id))) throw new ApiError(400, "invalid_request_error", `${String(o.id)} already exists.`);
          o.object = OBJECT_NAME[collection];
          o.created = typeof o.created === "number" ? o.created : Math.floor(Date.now() / 1000);
          o.livemode ??= false;
          if (collection !== "balance_transactions") o.metadata ??= {};
          return publicView(store.insert(collection, o as StripeObject));
        });
      }
      store.save();
      return send(res, 200, { ok: true, inserted });
    }
    // A bank transfer arriving, dated as given (`arrivedAt`, ISO) to simulate money that comes late.
    const fund = path.match(/^\/_fake\/transfers\/([A-Za-z0-9_]+)$/);
    if (method === "POST" && fund) {
      const body = await json();
      const at = typeof body.arrivedAt === "string" ? Date.parse(body.arrivedAt) : NaN;
      const params = { amount: String(body.amount ?? ""), currency: typeof body.currency === "string" ? body.currency : "usd", ...(typeof body.reference === "string" ? { reference: body.reference } : {}) };
      const result = fundCashBalance(ctx, fund[1]!, params, Number.isFinite(at) ? Math.floor(at / 1000) : undefined);
      return send(res, result.status, result.body);
    }
    const pay = path.match(/^\/_fake\/pay\/([A-Za-z0-9_]+)$/);
    if (method === "POST" && pay) {
      const body = await json();
      const result = payCheckoutSession(ctx, pay[1]!, typeof body.card === "string" ? body.card : "");
      const status = result.outcome === "succeeded" ? 200 : result.outcome === "not_open" ? (result.session ? 409 : 404) : 402;
      return send(res, status, result);
    }
    throw new ApiError(404, "invalid_request_error", `Unknown control endpoint ${method} ${path}.`);
  }

  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(options.port ?? 4010, options.host ?? "127.0.0.1", () => resolve());
  });
  const { port } = server.address() as AddressInfo;
  const url = `http://${options.host ?? "127.0.0.1"}:${port}`;
  if (!options.publicUrl) ctx.publicUrl = url;
  queue.start();
  return {
    url,
    port,
    store,
    close: async () => {
      await queue.stop();
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}

/** Options from the environment, for `npm run mocks` and direct runs. */
export function stripeFakeOptionsFromEnv(env: NodeJS.ProcessEnv = process.env): StripeFakeOptions {
  return {
    port: Number(env.STRIPE_FAKE_PORT ?? 4010),
    host: env.STRIPE_FAKE_HOST ?? "127.0.0.1",
    dataDir: env.DATA_DIR ?? "./data",
    webhookUrl: env.STRIPE_FAKE_WEBHOOK_URL ?? "http://127.0.0.1:3000/api/webhooks/stripe",
    webhookSecret: env.STRIPE_WEBHOOK_SECRET ?? "whsec_layerwright_local",
    publicUrl: env.STRIPE_FAKE_PUBLIC_URL,
  };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const fake = await startStripeFake(stripeFakeOptionsFromEnv());
  console.log(`[stripe-fake] listening on ${fake.url}`);
}
