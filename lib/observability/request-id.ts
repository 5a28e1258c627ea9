import "server-only";
import { headers } from "next/headers";
import type { Logger } from "pino";
import { isSafeRequestId, logFor } from "./log";

/** The header proxy.ts sets on every request (and returns on the response). */
export const REQUEST_ID_HEADER = "x-request-id";

/** This request's id, from the header proxy.ts set; null outside a request (scripts, timers). */
export async function currentRequestId(): Promise<string | null> {
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
