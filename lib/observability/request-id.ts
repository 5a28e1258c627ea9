import "server-only";
import { AsyncLocalStorage } from "node:async_hooks";
import { headers } from "next/headers";
import type { Logger } from "pino";
import { isSafeRequestId, logFor } from "./log";

/** The header that carries a request's id in and out (pages: set by proxy.ts; API routes: by defineRoute). */
export const REQUEST_ID_HEADER = "x-request-id";

/** The id of the API request being handled, set by the route wrapper (proxy.ts does not run for /api). */
const routeRequestId = new AsyncLocalStorage<string>();

/** A request's id: the incoming header when it is a plain token (a trusted front proxy's), else a new one. */
export function requestIdFrom(incoming: Headers): string {
  const given = incoming.get(REQUEST_ID_HEADER);
  return isSafeRequestId(given) ? given : crypto.randomUUID();
}

/** Runs `fn` as the request with this id: `currentRequestId` and `requestLog` inside it name it. */
export function withRequestId<T>(id: string, fn: () => T): T {
  return routeRequestId.run(id, fn);
}

/** This request's id (the route wrapper's, else the header proxy.ts set); null outside a request (scripts, timers). */
export async function currentRequestId(): Promise<string | null> {
  const own = routeRequestId.getStore();
  if (own) return own;
  try {
    const value = (await headers()).get(REQUEST_ID_HEADER);
    return isSafeRequestId(value) ? value : null;
  } catch {
    return null;
  }
}

/** A logger bound to the current request's id (route handlers, actions, server components). */
export async function requestLog(bindings: Record<string, unknown> = {}): Promise<Logger> {
  return logFor({ requestId: await currentRequestId(), ...bindings });
}
