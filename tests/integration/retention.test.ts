/**
 * Retention of clients' model files: the daily job deletes the model files of orders closed or
 * cancelled longer ago than the bureau's period (audited; requests, parts, file names, analyses
 * and documents stay); a client admin can ask for a finished order's files to go at once.
 */
import { and, count, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "../../db/client";
import { claimRetentionRun, getBureauSettings, getFileRetention, setModelRetentionDays } from "../../db/queries/retention";
import { auditLog, documents, fileRevisions, parts, requests, stageEvents } from "../../db/schema";
import { runRetention } from "../../lib/retention/run";
import { createTestDb, type TestDb } from "../helpers/test-db";
import { userIdOf } from "./admin-setup";

let t: TestDb;
let db: Db;
const NOW = new Date("2027-03-01T03:00:00Z");
const DAY = 24 * 3600_000;

beforeAll(async () => {
  t = await createTestDb({ seeded: true });
  db = t.db;
}, 120_000);
afterAll(() => t?.close());

async function requestOf(project: string) {
  const [r] = await db.select().from(requests).where(eq(requests.projectName, project));
  return r!;
}
async function finishAt(requestId: string, stage: "closed" | "cancelled", at: Date) {
  await db.update(requests).set({ stage }).where(eq(requests.id, requestId));
  await db.insert(stageEvents).values({ requestId, toStage: stage, at });
}
async function keysOf(requestId: string) {
  const rows = await db.selectDistinct({ key: fileRevisions.fileKey }).from(fileRevisions).innerJoin(parts, eq(parts.id, fileRevisions.partId)).where(eq(parts.requestId, requestId));
  return rows.map((r) => r.key).sort();
}

describe("the daily retention job", () => {
  it("deletes the model files of orders finished longer ago than the period, once, and keeps the records", async () => {
    const admin = await userIdOf(db, "admin@ostrevane.example");
    expect((await getBureauSettings(db)).modelRetentionDays).toBe(180);
    await setModelRetentionDays(db, { days: 30, actorId: admin, now: NOW });
    expect((await getBureauSettings(db)).modelRetentionDays).toBe(30);

    const old = await requestOf("Flap track fairing tool");
    const recent = await requestOf("Antenna bracket fixture");
    await finishAt(old.id, "closed", new Date(NOW.getTime() - 40 * DAY));
    await finishAt(recent.id, "cancelled", new Date(NOW.getTime() - 10 * DAY));
    const oldKeys = await keysOf(old.id);
    expect(oldKeys.length).toBeGreaterThan(0);
    const revisionsBefore = (await db.select({ n: count() }).from(fileRevisions))[0]!.n;
    const documentsBefore = (await db.select({ n: count() }).from(documents))[0]!.n;

    const deleted: string[] = [];
    const summary = await runRetention(db, { now: NOW, deleteStoredFiles: async (keys) => void deleted.push(...keys) });
    expect(summary).toMatchObject({ requests: 1, files: oldKeys.length, failed: [] });
    expect(deleted.sort()).toEqual(oldKeys);
    expect(await getFileRetention(db, old.id)).toMatchObject({ filesDeletedCount: oldKeys.length, filesDeletedAt: NOW });
    expect(await getFileRetention(db, recent.id)).toBeNull();
    const [entry] = await db.select().from(auditLog).where(and(eq(auditLog.action, "files.deleted"), eq(auditLog.entityId, old.id)));
    expect(entry).toMatchObject({ actorId: null, orgId: old.orgId, after: { files: oldKeys.length, reason: "retention" } });
    expect((await db.select({ n: count() }).from(fileRevisions))[0]!.n).toBe(revisionsBefore);
    expect((await db.select({ n: count() }).from(documents))[0]!.n).toBe(documentsBefore);

    // Again: nothing left to delete.
    const again = await runRetention(db, { now: NOW, deleteStoredFiles: async () => { throw new Error("must not be called"); } });
    expect(again).toMatchObject({ requests: 0, files: 0 });
  });

  it("a store that refuses leaves the request for the next run", async () => {
    const recent = await requestOf("Antenna bracket fixture");
    const later = new Date(NOW.getTime() + 30 * DAY);
    const failed = await runRetention(db, { now: later, deleteStoredFiles: async () => { throw new Error("store read-only"); } });
    expect(failed.failed).toEqual([{ requestId: recent.id, message: "store read-only" }]);
    expect((await getFileRetention(db, recent.id))?.filesDeletedAt ?? null).toBeNull();
    const ok = await runRetention(db, { now: later, deleteStoredFiles: async () => undefined });
    expect(ok.requests).toBe(1);
  });

  it("runs once per UTC day however many processes ask", async () => {
    expect(await claimRetentionRun(db, "2027-03-01")).toBe(true);
    expect(await claimRetentionRun(db, "2027-03-01")).toBe(false);
    expect(await claimRetentionRun(db, "2027-03-02")).toBe(true);
  });
});
