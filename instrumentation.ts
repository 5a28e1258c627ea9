/**
 * Next.js start-up and error hooks. `onRequestError` records every server error (render, route
 * handler, server action, proxy) as one structured log line with the request's id, path and
 * where it happened; the user sees error.tsx with the same digest.
 */
import type { Instrumentation } from "next";

export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
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
