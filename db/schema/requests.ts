import { index, integer, real, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { users } from "./auth";
import { createdAt, id, STAGES, ts } from "./common";
import type { EstimateResult } from "../../lib/estimating/types";
import { organisations } from "./organisations";

export const CURE_PROCESSES = ["room", "oven", "autoclave"] as const;
/** Delivery choices of an estimate (lib/estimating/lead-times.ts). */
export const LEAD_TIMES = ["standard", "expedite", "economy"] as const;
export type LeadTimeChoice = (typeof LEAD_TIMES)[number];
export type CureProcess = (typeof CURE_PROCESSES)[number];

/** A client's request; its stage is the order's whole life (DESIGN.md). */
export const requests = sqliteTable(
  "requests",
  {
    id: id(),
    reference: text("reference").notNull(),
    orgId: text("org_id")
      .notNull()
      .references(() => organisations.id),
    createdById: text("created_by_id")
      .notNull()
      .references(() => users.id),
    projectName: text("project_name").notNull(),
    neededBy: ts("needed_by"),
    cureProcess: text("cure_process", { enum: CURE_PROCESSES }).notNull().default("room"),
    cureTempC: real("cure_temp_c"),
    /** Expansion of the part laid up on the tool (ppm/K), for the CTE mismatch warning. */
    partCtePpmPerK: real("part_cte_ppm_per_k"),
    isControlled: integer("is_controlled", { mode: "boolean" }).notNull().default(false),
    /** The delivery the client asked for: standard, expedited, or economy. */
    leadTime: text("lead_time", { enum: LEAD_TIMES }).notNull().default("standard"),
    notes: text("notes").notNull().default(""),
    stage: text("stage", { enum: STAGES }).notNull().default("draft"),
    /** Stage to return to when an on_hold request is released. */
    heldFromStage: text("held_from_stage", { enum: STAGES }),
    submittedAt: ts("submitted_at"),
    createdAt: createdAt(),
    updatedAt: ts("updated_at")
      .notNull()
      .$defaultFn(() => new Date()),
  },
  (t) => [
    uniqueIndex("requests_reference_uq").on(t.reference),
    // the portal list: one index per sort it offers, firm first, id last (its tie-break), so a
    // page is read in order from the index and stops at its last row (db/queries/requests.ts)
    index("requests_org_idx").on(t.orgId, t.updatedAt, t.id),
    index("requests_org_creator_idx").on(t.orgId, t.createdById, t.updatedAt, t.id),
    index("requests_org_stage_idx").on(t.orgId, t.stage, t.updatedAt, t.id),
    index("requests_org_reference_idx").on(t.orgId, t.reference),
    index("requests_org_project_idx").on(t.orgId, t.projectName, t.id),
    index("requests_org_needed_idx").on(t.orgId, t.neededBy, t.id),
    index("requests_stage_idx").on(t.stage, t.updatedAt),
  ],
);
export type Request = typeof requests.$inferSelect;
export type NewRequest = typeof requests.$inferInsert;

export const parts = sqliteTable(
  "parts",
  {
    id: id(),
    requestId: text("request_id")
      .notNull()
      .references(() => requests.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    materialKey: text("material_key").notNull(),
    allowanceMm: real("allowance_mm").notNull(),
    quantity: integer("quantity").notNull().default(1),
    printMode: text("print_mode", { enum: ["solid", "shell"] }).notNull().default("solid"),
    shellWalls: integer("shell_walls").notNull().default(2),
    units: text("units", { enum: ["mm", "in"] }).notNull().default("mm"),
    unitsConfirmed: integer("units_confirmed", { mode: "boolean" }).notNull().default(false),
    cellKey: text("cell_key"),
    /** Indices of the bodies to print, for STEP/IGES assemblies; null = all. */
    selectedBodies: text("selected_bodies", { mode: "json" }).$type<number[] | null>(),
    /** Why the last file sent for this part was refused (kept so a reload still says it); null once a file is taken. */
    fileProblem: text("file_problem"),
    currentRevisionId: text("current_revision_id"),
    sort: integer("sort").notNull().default(0),
    createdAt: createdAt(),
  },
  (t) => [index("parts_request_idx").on(t.requestId)],
);
export type Part = typeof parts.$inferSelect;
export type NewPart = typeof parts.$inferInsert;

/** Files as the upload service reported them, before and after they are attached to a part. */
export const uploads = sqliteTable(
  "uploads",
  {
    id: id(),
    fileKey: text("file_key").notNull(),
    fileName: text("file_name").notNull(),
    sizeBytes: integer("size_bytes").notNull(),
    url: text("url").notNull(),
    contentType: text("content_type"),
    userId: text("user_id")
      .notNull()
      .references(() => users.id),
    orgId: text("org_id").references(() => organisations.id),
    purpose: text("purpose", { enum: ["model", "attachment", "inspection_report", "document"] })
      .notNull()
      .default("model"),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("uploads_file_key_uq").on(t.fileKey), index("uploads_user_idx").on(t.userId)],
);
export type Upload = typeof uploads.$inferSelect;

export const fileRevisions = sqliteTable(
  "file_revisions",
  {
    id: id(),
    partId: text("part_id")
      .notNull()
      .references(() => parts.id, { onDelete: "cascade" }),
    revision: integer("revision").notNull(),
    uploadId: text("upload_id").references(() => uploads.id),
    fileKey: text("file_key").notNull(),
    fileName: text("file_name").notNull(),
    sizeBytes: integer("size_bytes").notNull(),
    sha256: text("sha256"),
    format: text("format"),
    uploadedById: text("uploaded_by_id")
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("file_revisions_part_rev_uq").on(t.partId, t.revision)],
);
export type FileRevision = typeof fileRevisions.$inferSelect;

export const ANALYSIS_STATUSES = ["queued", "running", "done", "failed"] as const;

/** The engine's result for one file revision with one set of options. */
export const analyses = sqliteTable(
  "analyses",
  {
    id: id(),
    revisionId: text("revision_id")
      .notNull()
      .references(() => fileRevisions.id, { onDelete: "cascade" }),
    status: text("status", { enum: ANALYSIS_STATUSES }).notNull().default("queued"),
    progress: real("progress").notNull().default(0),
    stageLabel: text("stage_label"),
    options: text("options", { mode: "json" }).$type<Record<string, unknown>>().notNull(),
    /** EstimateResult of lib/estimating, as JSON. */
    result: text("result", { mode: "json" }).$type<EstimateResult>(),
    errorCode: text("error_code"),
    errorMessage: text("error_message"),
    rateCardId: text("rate_card_id"),
    /** Runs started (a run whose process died counts); bounded, then the row ends failed. */
    attempts: integer("attempts").notNull().default(0),
    /** A running job's claim: past this instant, a sweeper may take the job over. */
    leaseUntil: ts("lease_until"),
    createdAt: createdAt(),
    finishedAt: ts("finished_at"),
  },
  (t) => [index("analyses_revision_idx").on(t.revisionId, t.createdAt), index("analyses_status_lease_idx").on(t.status, t.leaseUntil)],
);
export type Analysis = typeof analyses.$inferSelect;
