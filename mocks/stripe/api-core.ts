/** The payment service fake: errors, answers, parameters, expansion, lists and retrieval shared by its endpoints. */
import type { WebhookQueue } from "./delivery";
import { arr, obj, str, type FormObject } from "./form";
import type { Collection, Store, StripeObject } from "./store";
import { collectionForId } from "./store";

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly type: string,
    message: string,
    readonly code?: string,
    readonly param?: string,
  ) {
    super(message);
  }
  toJSON() {
    return {
      error: {
        type: this.type,
        message: this.message,
        ...(this.code ? { code: this.code } : {}),
        ...(this.param ? { param: this.param } : {}),
      },
    };
  }
}

export interface ApiContext {
  store: Store;
  queue: WebhookQueue;
  publicUrl: string;
}

export interface ApiResult {
  status: number;
  body: unknown;
  headers?: Record<string, string>;
}

export const now = () => Math.floor(Date.now() / 1000);

/** Test-mode processing fee: 2.9 % + 30¢ of each charge. A made-up test figure, not a price list. */
export function testFeeCents(amountCents: number): number {
  return Math.round(amountCents * 0.029) + 30;
}

export const missing = (param: string) =>
  new ApiError(400, "invalid_request_error", `Missing required param: ${param}.`, "parameter_missing", param);
export const invalid = (param: string, message: string) =>
  new ApiError(400, "invalid_request_error", message, "parameter_invalid_integer", param);

export function noSuch(kind: string, id: string): ApiError {
  return new ApiError(404, "invalid_request_error", `No such ${kind}: '${id}'`, "resource_missing", "id");
}

export function intParam(params: FormObject, name: string, opts: { min?: number } = {}): number | undefined {
  const raw = str(params[name]);
  if (raw === undefined) return undefined;
  if (!/^-?\d+$/.test(raw)) throw invalid(name, `Invalid integer: ${raw}`);
  const n = Number(raw);
  if (opts.min !== undefined && n < opts.min) {
    throw new ApiError(400, "invalid_request_error", `This value must be greater than or equal to ${opts.min}.`, "parameter_invalid_integer", name);
  }
  return n;
}

// ---------------------------------------------------------------------------------------------
// Expansion and lists

export function expandPaths(params: FormObject): string[] {
  const e = params.expand;
  if (typeof e === "string") return [e];
  return (arr(e) ?? []).filter((x): x is string => typeof x === "string");
}

/** Replace id strings at dotted paths (`payment_intent`, `latest_charge.balance_transaction`) by the objects. */
export function expand(store: Store, object: StripeObject, paths: string[]): StripeObject {
  const copy = structuredClone(object) as Record<string, unknown>;
  for (const p of paths) expandAt(store, copy, p.split("."));
  // Fields with a leading underscore are the fake's own bookkeeping, never sent.
  return JSON.parse(JSON.stringify(copy, (k: string, v: unknown) => (k.startsWith("_") ? undefined : v))) as StripeObject;
}

export function expandAt(store: Store, node: Record<string, unknown>, parts: string[]): void {
  const [head, ...rest] = parts;
  if (!head) return;
  let value = node[head];
  if (typeof value === "string" && collectionForId(value)) {
    const found = store.find(value);
    if (found) node[head] = value = structuredClone(found);
  }
  if (rest.length > 0 && value && typeof value === "object") expandAt(store, value as Record<string, unknown>, rest);
}

export function createdFilter(params: FormObject): (created: number) => boolean {
  const c = params.created;
  if (typeof c === "string") {
    const exact = Number(c);
    return (t) => t === exact;
  }
  const o = obj(c) ?? {};
  const bound = (k: string) => {
    const v = str(o[k]);
    if (v === undefined) return undefined;
    if (!/^\d+$/.test(v)) throw invalid(`created[${k}]`, `Invalid integer: ${v}`);
    return Number(v);
  };
  const gte = bound("gte");
  const gt = bound("gt");
  const lte = bound("lte");
  const lt = bound("lt");
  return (t) =>
    (gte === undefined || t >= gte) && (gt === undefined || t > gt) && (lte === undefined || t <= lte) && (lt === undefined || t < lt);
}

/** A Stripe list: newest first, `limit` (1–100, default 10), cursors `starting_after`/`ending_before`. */
export function list(
  ctx: ApiContext,
  collection: Collection,
  url: string,
  params: FormObject,
  filter: (o: StripeObject) => boolean = () => true,
): ApiResult {
  const limit = intParam(params, "limit", { min: 1 }) ?? 10;
  if (limit > 100) throw new ApiError(400, "invalid_request_error", "This value must be less than or equal to 100.", "parameter_invalid_integer", "limit");
  const inRange = createdFilter(params);
  const all = ctx.store.state.objects[collection]
    .map((o, i) => ({ o, i }))
    .filter(({ o }) => inRange(o.created) && filter(o))
    .sort((a, b) => b.o.created - a.o.created || b.i - a.i)
    .map(({ o }) => o);
  let start = 0;
  let end = all.length;
  const after = str(params.starting_after);
  const before = str(params.ending_before);
  if (after) {
    const idx = all.findIndex((o) => o.id === after);
    if (idx === -1) throw noSuch(collection.replace(/s$/, ""), after);
    start = idx + 1;
    end = Math.min(all.length, start + limit);
  } else if (before) {
    const idx = all.findIndex((o) => o.id === before);
    if (idx === -1) throw noSuch(collection.replace(/s$/, ""), before);
    end = idx;
    start = Math.max(0, end - limit);
  } else {
    end = Math.min(all.length, limit);
  }
  const page = all.slice(start, end);
  const hasMore = before ? start > 0 : end < all.length;
  const paths = expandPaths(params)
    .filter((p) => p.startsWith("data."))
    .map((p) => p.slice(5));
  return {
    status: 200,
    body: { object: "list", data: page.map((o) => expand(ctx.store, o, paths)), has_more: hasMore, url },
  };
}

export function retrieve(ctx: ApiContext, collection: Collection, kind: string, id: string, params: FormObject): ApiResult {
  const found = ctx.store.get(collection, id);
  if (!found) throw noSuch(kind, id);
  return { status: 200, body: expand(ctx.store, found, expandPaths(params)) };
}

/** Strip the fake's private fields (leading underscore) before answering. */
export function publicView(o: StripeObject): StripeObject {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(o)) if (!k.startsWith("_")) out[k] = v;
  return out as StripeObject;
}

export function throwNoSuch(kind: string, id: string): never {
  throw noSuch(kind, id);
}

/** A list filter on exact field values given as parameters (`?customer=cus_…`). */
export function byField(params: FormObject, fields: string[]): (o: StripeObject) => boolean {
  const wanted = fields.map((f) => [f, str(params[f])] as const).filter(([, v]) => v !== undefined);
  return (o) => wanted.every(([f, v]) => String(o[f]) === v);
}
