import { errorFields } from "./observability/log";
import { requestLog } from "./observability/request-id";

/** One error type for expected failures; the code maps to an HTTP status and plain user text. */
export type AppErrorCode =
  | "unauthenticated"
  | "forbidden"
  | "not_found"
  | "invalid_input"
  | "conflict"
  | "rate_limited"
  | "unavailable"
  | "payment_failed"
  | "gone"
  | "busy"
  | "unprocessable"
  | "timeout"
  | "bad_gateway";

/**
 * The one table of error → HTTP status. A code's kind (before ":") picks the status; a full code
 * listed here ("busy:yours") overrides its kind. Actions answer the code itself; routes the status.
 */
const STATUS: Record<AppErrorCode, number> & Record<string, number> = {
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  invalid_input: 400,
  conflict: 409,
  rate_limited: 429,
  unavailable: 503,
  payment_failed: 402,
  gone: 410,
  // The estimator (lib/analysis/estimator.ts): busy as a whole, or this caller's share used up.
  busy: 503,
  "busy:yours": 429,
  "busy:firm": 429,
  unprocessable: 422,
  timeout: 504,
  bad_gateway: 502,
};

export class AppError extends Error {
  /** e.g. "forbidden:order" — the part before ":" picks the status. */
  constructor(
    public readonly code: `${AppErrorCode}` | `${AppErrorCode}:${string}`,
    message: string,
    public readonly fieldErrors?: Record<string, string[]>,
    /** Seconds after which trying again may succeed (sent as Retry-After). */
    public readonly retryAfterS?: number,
  ) {
    super(message);
    this.name = "AppError";
  }

  get kind(): AppErrorCode {
    return this.code.split(":")[0] as AppErrorCode;
  }

  get status(): number {
    return STATUS[this.code] ?? STATUS[this.kind] ?? 500;
  }
}

export function isAppError(e: unknown): e is AppError {
  return e instanceof AppError;
}

export const notFound = (what = "record") => new AppError(`not_found:${what}`, `That ${what} was not found.`);

/** Result shape returned by server actions. */
export type ActionResult<T = undefined> =
  | { ok: true; data: T }
  | { ok: false; code: string; message: string; fieldErrors?: Record<string, string[]> };

/** Turn an unknown throw into an action result; unexpected errors are logged, shown plainly. */
export function toActionError(e: unknown): Extract<ActionResult<never>, { ok: false }> {
  if (isAppError(e)) return { ok: false, code: e.code, message: e.message, fieldErrors: e.fieldErrors };
  // The log line carries the request's id; writing it need not hold up the answer.
  void requestLog().then((log) => log.error({ ...errorFields(e), event: "action.error" }, "server action failed"));
  return { ok: false, code: "internal", message: "Something went wrong on our side. Nothing was saved; please try again." };
}
