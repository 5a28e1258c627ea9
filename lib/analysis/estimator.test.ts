import { describe, expect, it } from "vitest";
import { AppError } from "@/lib/errors";
import { EstimateInputError } from "@/lib/estimating/errors";
import { EstimateJobError, OwnerBusyError, QueueFullError } from "@/lib/estimating/pool";
import { estimatorError } from "./estimator";

const asApp = (e: unknown) => {
  expect(e).toBeInstanceOf(AppError);
  const a = e as AppError;
  return { code: a.code, status: a.status, retryAfterS: a.retryAfterS };
};

describe("the estimator's one table of answers", () => {
  it("a busy estimator: this user's share 429, the whole pool 503, each with its wait", () => {
    expect(asApp(estimatorError(new OwnerBusyError(12)))).toEqual({ code: "busy:yours", status: 429, retryAfterS: 12 });
    expect(asApp(estimatorError(new QueueFullError(30)))).toEqual({ code: "busy", status: 503, retryAfterS: 30 });
  });

  it("a file the engine cannot read is 422 under the engine's own code", () => {
    expect(asApp(estimatorError(new EstimateInputError("stl:truncated", "The file ends early.")))).toMatchObject({ code: "unprocessable:stl:truncated", status: 422 });
  });

  it("a failed job: time-out 504, storage 502, a dead worker 503", () => {
    expect(asApp(estimatorError(new EstimateJobError("timeout", "ran too long"))).status).toBe(504);
    expect(asApp(estimatorError(new EstimateJobError("storage", "no file"))).status).toBe(502);
    expect(asApp(estimatorError(new EstimateJobError("worker-failed", "died"))).status).toBe(503);
  });

  it("anything else passes through untouched (logged as a server error by the door)", () => {
    const e = new Error("unexpected");
    expect(estimatorError(e)).toBe(e);
  });
});
