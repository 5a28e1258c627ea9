import "server-only";
import { NextResponse } from "next/server";
import { ZodError } from "zod";
import { isAppError } from "@/lib/errors";
import { errorFields } from "@/lib/observability/log";
import { requestLog } from "@/lib/observability/request-id";

/** Wrap a route handler: AppError → its status and plain message; zod → 400; anything else → logged 500. */
export function withErrors<A extends unknown[]>(handler: (...args: A) => Promise<Response>) {
  return async (...args: A): Promise<Response> => {
    try {
      return await handler(...args);
    } catch (e) {
      if (isAppError(e)) {
        return NextResponse.json({ error: { code: e.code, message: e.message, fieldErrors: e.fieldErrors } }, { status: e.status });
      }
      if (e instanceof ZodError) {
        return NextResponse.json(
          { error: { code: "invalid_input", message: "The request was not valid.", fieldErrors: e.flatten().fieldErrors } },
          { status: 400 },
        );
      }
      (await requestLog()).error({ ...errorFields(e), event: "route.error" }, "route handler failed");
      return NextResponse.json({ error: { code: "internal", message: "Something went wrong on our side." } }, { status: 500 });
    }
  };
}
