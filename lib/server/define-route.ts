import "server-only";
import { NextResponse } from "next/server";
import { ZodError, type z } from "zod";
import { getDb, type Db } from "@/db/client";
import { AppError, isAppError } from "@/lib/errors";
import { errorFields } from "@/lib/observability/log";
import { REQUEST_ID_HEADER, requestIdFrom, requestLog, withRequestId } from "@/lib/observability/request-id";
import type { AsSent } from "@/lib/contracts/wire";
import { enter, type Access, type UserFor } from "./access";

type Params = Record<string, string | string[]>;
type Infer<S> = S extends z.ZodType ? z.output<S> : undefined;
/** What the handler may return: a Response, or data matching the contract as sent (Dates allowed where strings go out). */
type Answer<R> = R extends z.ZodType ? AsSent<z.output<R>> | Response : unknown;

interface RouteSpec<A extends Access, Q extends z.ZodType | undefined, B extends z.ZodType | undefined, R extends z.ZodType | undefined = undefined> {
  /** Who may call it (lib/server/access.ts). */
  access: A;
  /** The query string, parsed as an object of strings (coerce numbers and dates in the schema). */
  query?: Q;
  /** A JSON body. */
  body?: B;
  /** Extra headers on a JSON answer (e.g. `{ "cache-control": "no-store" }`). */
  headers?: Record<string, string>;
  /**
   * The answer's contract (lib/contracts/), shared with the screen that reads it. Types the
   * handler's data; outside production each JSON answer is checked against it, so a route that
   * drifts from its contract fails its tests rather than a screen.
   */
  response?: R;
}

export interface RouteContext<A extends Access, Q, B, P> {
  req: Request;
  params: P;
  user: UserFor<A>;
  db: Db;
  query: Infer<Q>;
  body: Infer<B>;
}

/** The one error → answer mapping of every route: `{ error: { code, message, fieldErrors? } }` with the table's status. */
export function errorResponse(e: unknown): Response {
  if (isAppError(e)) {
    const headers = e.retryAfterS !== undefined ? { "retry-after": String(e.retryAfterS) } : undefined;
    return NextResponse.json({ error: { code: e.code, message: e.message, fieldErrors: e.fieldErrors, retryAfterS: e.retryAfterS } }, { status: e.status, headers });
  }
  if (e instanceof ZodError) {
    return NextResponse.json({ error: { code: "invalid_input", message: "The request was not valid.", fieldErrors: e.flatten().fieldErrors } }, { status: 400 });
  }
  // Logged with the request's id; the answer says only that it failed.
  void requestLog().then((log) => log.error({ ...errorFields(e), event: "route.error" }, "route handler failed"));
  return NextResponse.json({ error: { code: "internal", message: "Something went wrong on our side." } }, { status: 500 });
}

const CHECK_CONTRACTS = process.env.NODE_ENV !== "production";

/** The answer as JSON carries it, against its contract; a mismatch is the route's defect (500, logged). */
function checkContract(schema: z.ZodType, out: unknown): void {
  const sent: unknown = JSON.parse(JSON.stringify(out));
  const r = schema.safeParse(sent);
  if (!r.success) throw new Error(`the answer does not match its contract: ${r.error.issues.slice(0, 3).map((i) => `${i.path.join(".")}: ${i.message}`).join("; ")}`);
}

/**
 * For a route that builds its JSON itself (a cached answer): the answer typed by its contract and,
 * outside production, checked against it like `response:` does.
 */
export function checkedAnswer<S extends z.ZodType>(schema: S, out: AsSent<z.output<S>>): AsSent<z.output<S>> {
  if (CHECK_CONTRACTS) checkContract(schema, out);
  return out;
}

async function readBody(req: Request): Promise<unknown> {
  return req.json().catch(() => {
    throw new AppError("invalid_input", "Send a JSON body.");
  });
}

/**
 * The one shape of a route handler: guard (`access`) → parse (`query`, `body`) → the handler with
 * the user and the database → a Response, or data sent as JSON. AppErrors and bad input answer
 * through `errorResponse`'s table; anything else is logged and answered 500. Each answer carries
 * the request's id (`x-request-id`), which its log lines name.
 *
 *     export const GET = defineRoute({ access: "accounts:ledger", query: ledgerQuerySchema }, async ({ query, db }) => listLedger(db, query));
 */
export function defineRoute<A extends Access, Q extends z.ZodType | undefined = undefined, B extends z.ZodType | undefined = undefined, P extends Params = Params, R extends z.ZodType | undefined = undefined>(
  spec: RouteSpec<A, Q, B, R>,
  handler: (ctx: RouteContext<A, Q, B, P>) => Promise<Answer<R>>,
): (req: Request, ctx?: { params: Promise<P> }) => Promise<Response> {
  const answer = async (req: Request, ctx?: { params: Promise<P> }): Promise<Response> => {
    try {
      const user = await enter(spec.access);
      const query = (spec.query ? spec.query.parse(Object.fromEntries(new URL(req.url).searchParams)) : undefined) as Infer<Q>;
      const body = (spec.body ? spec.body.parse(await readBody(req)) : undefined) as Infer<B>;
      const params = ((await ctx?.params) ?? {}) as P;
      const out = await handler({ req, params, user, db: getDb(), query, body });
      if (out instanceof Response) return out;
      if (spec.response && CHECK_CONTRACTS) checkContract(spec.response, out);
      return NextResponse.json(out, { headers: spec.headers });
    } catch (e) {
      return errorResponse(e);
    }
  };
  // The request's id (proxy.ts does not run for /api): kept from the caller when it is a plain
  // token, else new; every log line of the handler carries it, and so does the answer.
  return async (req, ctx) => {
    const requestId = requestIdFrom(req.headers);
    return withIdHeader(await withRequestId(requestId, () => answer(req, ctx)), requestId);
  };
}

/** The answer with `x-request-id` set (a Response whose headers are immutable is copied). */
function withIdHeader(res: Response, requestId: string): Response {
  try {
    res.headers.set(REQUEST_ID_HEADER, requestId);
    return res;
  } catch {
    const copy = new Response(res.body, res);
    copy.headers.set(REQUEST_ID_HEADER, requestId);
    return copy;
  }
}
