import { z } from "zod";
import type { EstimateResult } from "@/lib/estimating/types";
import { ROLES } from "@/db/schema/common";
import { STAGE_LABEL } from "@/lib/labels";
import { keysOf, listAnswer, wireDate } from "./wire";

/** The portal's polled routes, as sent (app/api/portal/**), shared with the hooks that poll them. */

/** GET /api/portal/analyses/:id: one analysis's progress, and its estimate when done. */
export const analysisPoll = z.object({
  id: z.string(),
  partId: z.string(),
  revisionId: z.string(),
  status: z.enum(["queued", "running", "done", "failed"]),
  progress: z.number(),
  stageLabel: z.string().nullable(),
  error: z.object({ code: z.string().nullable(), message: z.string().nullable() }).nullable(),
  /** The engine's result (lib/estimating/types.ts, its own typed contract); a client's view drops the alternatives' prices. */
  result: z.custom<EstimateResult>((v) => typeof v === "object" && v !== null).nullable(),
});
export type AnalysisPoll = z.infer<typeof analysisPoll>;

/** GET /api/portal/requests/:id: one request's stage, polled after paying. */
export const requestStatus = z.object({
  id: z.string(),
  reference: z.string(),
  projectName: z.string(),
  stage: keysOf(STAGE_LABEL),
  updatedAt: wireDate,
  order: z.object({ id: z.string(), totalCents: z.number().int(), depositCents: z.number().int() }).nullable(),
});
export type RequestStatus = z.infer<typeof requestStatus>;

/** GET /api/portal/me: who is signed in, for the parts of the (static) portal home that name them. */
export const portalMe = z.object({
  name: z.string().nullable(),
  email: z.string(),
  role: z.enum(ROLES),
});
export type PortalMe = z.infer<typeof portalMe>;

/** GET /api/portal/requests: the firm's (or the client's own) requests, a page at a time. */
export const portalListRow = z.object({
  id: z.string(),
  reference: z.string(),
  projectName: z.string(),
  stage: keysOf(STAGE_LABEL),
  neededBy: wireDate.nullable(),
  updatedAt: wireDate,
  isControlled: z.boolean(),
  createdByName: z.string().nullable(),
  partCount: z.number().int(),
  totalCents: z.number().int().nullable(),
  hasOrder: z.boolean(),
});
export const portalList = listAnswer(portalListRow).extend({ nextCursor: z.string().nullable() });
export type PortalListRow = z.infer<typeof portalListRow>;
export type PortalList = z.infer<typeof portalList>;
