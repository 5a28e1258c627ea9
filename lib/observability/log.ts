import "server-only";
import pino, { type Logger } from "pino";

/**
 * Structured logs: one JSON line per event on stdout (the process manager or the host collects
 * them). Every line from a request carries its `requestId` (set by proxy.ts, or taken from a
 * trusted front proxy's `x-request-id`), so one request can be followed through the route or
 * action, the analysis job and the estimate worker.
 *
 * Secrets and personal data stay out: credentials, cookies, tokens and signed URLs are redacted
 * wherever they appear one or two levels down.
 */
const REDACT = [
  "password",
  "passwordHash",
  "token",
  "secret",
  "totpSecret",
  "cookie",
  "authorization",
  "url",
  "*.password",
  "*.passwordHash",
  "*.token",
  "*.secret",
  "*.totpSecret",
  "*.cookie",
  "*.authorization",
  "*.url",
  "headers.cookie",
  "headers.authorization",
];

function level(): string {
  const raw = process.env.LOG_LEVEL;
  if (raw && ["fatal", "error", "warn", "info", "debug", "trace", "silent"].includes(raw)) return raw;
  // Tests keep quiet unless asked.
  return process.env.VITEST ? "silent" : "info";
}

const globalForLog = globalThis as unknown as { layerwrightLog?: Logger };

/** The process's root logger (one per process; worker threads make their own). */
export function rootLogger(): Logger {
  globalForLog.layerwrightLog ??= pino({
    level: level(),
    base: { pid: process.pid, service: "layerwright" },
    redact: { paths: REDACT, censor: "[redacted]" },
    timestamp: pino.stdTimeFunctions.isoTime,
    formatters: { level: (label) => ({ level: label }) },
  });
  return globalForLog.layerwrightLog;
}

/** A logger whose every line carries the request's id (and whatever else is bound). */
export function logFor(bindings: { requestId?: string | null; [key: string]: unknown }): Logger {
  const { requestId, ...rest } = bindings;
  return rootLogger().child(requestId ? { requestId, ...rest } : rest);
}

/** Accept a caller-supplied request id only when it is a short, plain token (it is echoed in logs and headers). */
export function isSafeRequestId(value: string | null | undefined): value is string {
  return typeof value === "string" && /^[A-Za-z0-9._:-]{8,80}$/.test(value);
}

/** Errors as plain fields (pino's own serializer keeps the stack). */
export function errorFields(e: unknown): { err: unknown } {
  return { err: e instanceof Error ? pino.stdSerializers.err(e) : e };
}
