/**
 * One demo request as the portal would have left it at its stage: the request, its part, the
 * uploaded file (saved into the local upload fake's store) with its revision and finished
 * analysis, and its stage history; from "quoted" on, the quote and order follow (./order.ts).
 */
import { createHash, randomUUID } from "node:crypto";
import { sql } from "drizzle-orm";
import { defaultRateCard } from "@/lib/estimating/defaults";
import { FLOW } from "@/lib/orders/stages";
import * as s from "@/db/schema";
import type { DemoRequest } from "./data";
import { DAY, optionsOf, staffId, type DemoAnalysis, type SeedContext, type SeededRequest, type Tx } from "./context";
import { seedQuoteAndOrder } from "./order";

export async function seedRequest(tx: Tx, ctx: SeedContext, demo: DemoRequest, n: number, analysis: DemoAnalysis): Promise<void> {
  const created = new Date(ctx.now.getTime() - demo.daysAgo * DAY);
  const effective = demo.stage === "on_hold" ? demo.heldFrom! : demo.stage === "cancelled" ? "submitted" : demo.stage;
  const reached = FLOW.indexOf(effective);
  const orgId = ctx.firms.orgIds.get(demo.firm)!;
  const authorId = ctx.userIds.get(demo.by)!;
  const [req] = await tx
    .insert(s.requests)
    .values({
      reference: `LW-${created.getUTCFullYear()}-${String(100 + n).padStart(4, "0")}`,
      orgId,
      createdById: authorId,
      projectName: demo.project,
      neededBy: new Date(created.getTime() + 60 * DAY),
      cureProcess: demo.cure,
      cureTempC: demo.cureTempC,
      partCtePpmPerK: demo.partCte ?? null,
      isControlled: Boolean(demo.controlled),
      notes: demo.notes ?? "",
      stage: demo.stage,
      heldFromStage: demo.stage === "on_hold" ? demo.heldFrom! : null,
      submittedAt: reached >= 1 ? new Date(created.getTime() + 0.1 * DAY) : null,
      createdAt: created,
      updatedAt: new Date(created.getTime() + reached * 0.5 * DAY),
    })
    .returning({ id: s.requests.id });
  const [part] = await tx
    .insert(s.parts)
    .values({
      requestId: req!.id,
      name: analysis.partName,
      materialKey: demo.material,
      allowanceMm: demo.allowanceMm ?? defaultRateCard.defaultAllowanceMm,
      quantity: demo.quantity ?? 1,
      units: demo.units ?? "mm",
      unitsConfirmed: true,
      printMode: "shell",
      shellWalls: demo.shellWalls ?? 2,
      cellKey: analysis.result.cell,
      createdAt: created,
    })
    .returning({ id: s.parts.id });
  const seeded: SeededRequest = { n, demo, created, orgId, authorId, requestId: req!.id, partId: part!.id, effective, reached, result: analysis.result };
  await seedRevision(tx, ctx, seeded, analysis);
  await seedStageHistory(tx, ctx, seeded);
  if (reached >= FLOW.indexOf("quoted")) await seedQuoteAndOrder(tx, ctx, seeded);
}

/** The file as uploaded through the upload service, its first revision and its finished analysis. */
async function seedRevision(tx: Tx, ctx: SeedContext, q: SeededRequest, analysis: DemoAnalysis) {
  const { bytes, fileName, result } = analysis;
  const fileKey = `seed-${randomUUID()}`;
  ctx.files.save(fileKey, Buffer.from(bytes), {
    name: fileName,
    type: "model/stl",
    customId: null,
    contentDisposition: "attachment",
    acl: "private",
    fileHash: createHash("md5").update(bytes).digest("hex"),
  });
  const [upload] = await tx
    .insert(s.uploads)
    .values({ fileKey, fileName, sizeBytes: bytes.length, url: `${ctx.fileBaseUrl}/${fileKey}`, contentType: "model/stl", userId: q.authorId, orgId: q.orgId, createdAt: q.created })
    .returning({ id: s.uploads.id });
  const [rev] = await tx
    .insert(s.fileRevisions)
    .values({
      partId: q.partId,
      revision: 1,
      uploadId: upload!.id,
      fileKey,
      fileName,
      sizeBytes: bytes.length,
      sha256: createHash("sha256").update(bytes).digest("hex"),
      format: result.format,
      uploadedById: q.authorId,
      createdAt: q.created,
    })
    .returning({ id: s.fileRevisions.id });
  await tx.update(s.parts).set({ currentRevisionId: rev!.id }).where(sql`${s.parts.id} = ${q.partId}`);
  await tx.insert(s.analyses).values({
    revisionId: rev!.id,
    status: "done",
    progress: 1,
    options: optionsOf(q.demo),
    result,
    rateCardId: ctx.rateCardId,
    createdAt: q.created,
    finishedAt: q.created,
  });
}

/** Stage history along the flow, half a day apart; a hold or cancellation after it. */
async function seedStageHistory(tx: Tx, ctx: SeedContext, q: SeededRequest) {
  const events = FLOW.slice(0, q.reached + 1);
  for (let i = 0; i < events.length; i++) {
    await tx.insert(s.stageEvents).values({
      requestId: q.requestId,
      fromStage: i === 0 ? null : events[i - 1]!,
      toStage: events[i]!,
      actorId: i === 0 ? q.authorId : i <= 2 ? staffId(ctx, "sales@ostrevane.example") : staffId(ctx, "production@ostrevane.example"),
      at: new Date(q.created.getTime() + i * 0.5 * DAY),
    });
  }
  const { stage, notes } = q.demo;
  if (stage === "on_hold" || stage === "cancelled") {
    await tx.insert(s.stageEvents).values({
      requestId: q.requestId,
      fromStage: q.effective,
      toStage: stage,
      actorId: staffId(ctx, "sales@ostrevane.example"),
      note: notes ?? (stage === "cancelled" ? "Cancelled at the client's request." : null),
      at: new Date(q.created.getTime() + (q.reached + 1) * 0.5 * DAY),
    });
  }
}
