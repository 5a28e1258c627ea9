/** What the demo seed's modules share: the clock, the transaction, the rows written so far. */
import { defaultRateCard } from "@/lib/estimating/defaults";
import type { EstimateResult } from "@/lib/estimating/types";
import type { FileStore } from "@/mocks/uploadthing/store";
import type { Db } from "@/db/client";
import type { Stage } from "@/db/schema/common";
import type { DemoRequest } from "./data";
import type { SeededFirms } from "./people";
import type { SeedProcessorRecord } from "./processor";

export const DAY = 86_400_000;

/** A transaction on the demo database. */
export type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

/** What every seeded request shares: the clock, the file store and the rows written before. */
export interface SeedContext {
  now: Date;
  files: FileStore;
  fileBaseUrl: string;
  rateCardId: string;
  firms: SeededFirms;
  /** e-mail → user id */
  userIds: Map<string, string>;
  /** the payment processor's side of the seeded payments, gathered as they are written */
  processorRecords: SeedProcessorRecord[];
}

/** A demo request's analysed mesh: the file's bytes, its name and part name, the engine's result. */
export interface DemoAnalysis {
  bytes: Uint8Array;
  fileName: string;
  partName: string;
  result: EstimateResult;
}

/** The request as written, handed on to its quote and order. */
export interface SeededRequest {
  /** its place in the demo list, 1-based (numbers, references and processor ids derive from it) */
  n: number;
  demo: DemoRequest;
  created: Date;
  orgId: string;
  authorId: string;
  requestId: string;
  partId: string;
  /** the stage the flow reached (a held request's stage before the hold, a cancelled one's "submitted") */
  effective: Stage;
  /** index of `effective` in the flow */
  reached: number;
  result: EstimateResult;
}

export const staffId = (ctx: SeedContext, email: string) => ctx.userIds.get(email)!;

export function optionsOf(r: DemoRequest) {
  return {
    units: r.units ?? "mm",
    materialKey: r.material,
    allowanceMm: r.allowanceMm ?? defaultRateCard.defaultAllowanceMm,
    // shells by default, wall count from the allowance (as the portal asks for it)
    printMode: "shell",
  } as const;
}
