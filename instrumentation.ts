/**
 * Next.js start-up and error hooks.
 *
 * `register` runs once when a server process starts. In production it checks the environment
 * first and stops the process, naming each missing or refused variable, rather than serve with a
 * published demo secret (exit code 78, "configuration error", which `npm start` does not retry).
 * Then it gives Auth.js the app's own URL, so links are never built from a request's Host header,
 * and starts the background work.
 *
 * `onRequestError` records every server error (render, route handler, server action, proxy) as one
 * structured log line with the request's id, path and where it happened; the user sees error.tsx
 * with the same digest.
 */
import type { Instrumentation } from "next";

export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { env, isProductionRuntime, productionEnvProblems } = await import("./lib/env");
  if (isProductionRuntime()) {
    const problems = productionEnvProblems(process.env);
    if (problems.length) {
      console.error(`Layerwright will not start: the environment is not fit for production.\n${problems.map((p) => `  - ${p}`).join("\n")}`);
      process.exit(78);
    }
  }
  process.env.AUTH_URL ??= env().APP_URL;
  const { startBackgroundWork } = await import("./lib/observability/background");
  startBackgroundWork();
}

export const onRequestError: Instrumentation.onRequestError = async (error, request, context) => {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { errorFields, logFor } = await import("./lib/observability/log");
  const header = request.headers["x-request-id"];
  const requestId = Array.isArray(header) ? header[0] : header;
  const digest = (error as { digest?: string }).digest;
  logFor({ requestId: requestId ?? null }).error(
    {
      ...errorFields(error),
      digest,
      method: request.method,
      // The path only: query strings can carry tokens (reset links, signed reads).
      path: request.path.split("?")[0],
      routerKind: context.routerKind,
      routePath: context.routePath,
      routeType: context.routeType,
      renderSource: context.renderSource,
    },
    "request failed",
  );
};
