/**
 * Demo seed: the invented scenario of DESIGN.md. Wipes the tables and writes the bureau's
 * catalogue, the three client firms, one user per role and one request in every stage, each with
 * a generated mesh analysed by the real engine. Run: `npm run db:migrate && npm run db:seed`.
 */
import { writeFileSync } from "node:fs";
import path from "node:path";
import { sql } from "drizzle-orm";
import { analyse } from "@/lib/estimating/analyse";
import { defaultCells, defaultMaterials, defaultRateCard } from "@/lib/estimating/defaults";
import { ROUTER_KEY } from "@/lib/estimating/ledger";
import { zonedToUtc } from "@/lib/estimating/schedule";
import { plantDay } from "@/lib/scheduling/reschedule";
import { binaryStl, drillFixture, hullPlugInches, layupMold, tooLongBeam, extrude, type IndexedMesh } from "@/mocks/fixtures/meshes";
import { FileStore } from "@/mocks/uploadthing/store";
import { openDb, type Db } from "@/db/client";
import { numberUnnumberedReceipts } from "@/db/queries/payments";
import * as s from "@/db/schema";
import { DAY, optionsOf, staffId, type DemoAnalysis, type SeedContext } from "./context";
import { DEMO_PASSWORDS, DEMO_REQUESTS, DEMO_USERS, FIRMS, type DemoMeshKey, type DemoRequest } from "./data";
import { DEMO_TERMS, seedDocuments } from "./documents";
import { seedFirms, seedUsers, zoneOfFirm, type SeededFirms } from "./people";
import type { SeedProcessorRecord } from "./processor";
import { seedProcurement } from "./procurement";
import { seedRequest } from "./request";

const MESHES: Record<DemoMeshKey, { name: string; make: () => IndexedMesh; file: string }> = {
  "layup-mold": { name: "Layup mold with flange", make: () => layupMold(), file: "layup-mold.stl" },
  "hull-plug": { name: "Hull plug", make: () => hullPlugInches(), file: "hull-plug-inches.stl" },
  "drill-fixture": { name: "Drill fixture", make: () => drillFixture(), file: "drill-fixture.stl" },
  "too-long-beam": { name: "Spar tool, one piece", make: () => tooLongBeam(), file: "spar-tool-12m.stl" },
  "trim-fixture": {
    name: "Trim fixture",
    make: () => extrude([[0, 0], [900, 0], [900, 80], [520, 80], [520, 260], [380, 260], [380, 80], [0, 80]], 700),
    file: "trim-fixture.stl",
  },
};

/** Tables in an order that respects foreign keys when deleting. */
const WIPE_ORDER = [
  "issued_documents", "document_series", "audit_log", "email_outbox", "webhook_events", "transfer_funds", "refunds", "payments", "schedule_blocks", "stage_events", "documents", "messages",
  "orders", "quote_lines", "quotes", "analyses", "tax_exemptions", "file_revisions", "uploads", "parts", "requests", "invitations", "memberships", "addresses",
  "organisations", "password_reset_tokens", "sign_in_attempts", "sessions", "accounts", "verification_tokens",
  "rate_cards", "cells", "materials", "terms_of_sale", "users",
];

export interface SeedOptions {
  now?: Date;
  dataDir?: string;
  /** Base URL where the upload service serves stored files (the local fake by default). */
  fileBaseUrl?: string;
  quiet?: boolean;
}

export interface SeedResult {
  users: number;
  requests: number;
  processorRecords: SeedProcessorRecord[];
}

export async function seed(db: Db, opts: SeedOptions = {}): Promise<SeedResult> {
  const now = opts.now ?? new Date();
  const dataDir = opts.dataDir ?? process.env.DATA_DIR ?? "./data";
  for (const table of WIPE_ORDER) await db.run(sql.raw(`DELETE FROM ${table}`));
  const rateCardId = await seedCatalogue(db, now);
  const firms = await seedFirms(db, now);
  const ctx: SeedContext = {
    now,
    // Demo files go straight into the local upload fake's store, as if uploaded through it.
    files: new FileStore(dataDir),
    fileBaseUrl: opts.fileBaseUrl ?? process.env.UPLOADTHING_FILE_BASE_URL ?? "http://localhost:4030/f",
    rateCardId,
    firms,
    userIds: await seedUsers(db, now, firms.orgIds),
    processorRecords: [],
  };
  const analysed = new Map<string, DemoAnalysis>();
  for (const [i, r] of DEMO_REQUESTS.entries()) {
    const analysis = await analysisOf(r, firms, now, analysed);
    await db.transaction((tx) => seedRequest(tx, ctx, r, i + 1, analysis));
  }
  await seedMaintenance(db, now, staffId(ctx, "production@ostrevane.example"));
  await seedProcurement(db, firms.orgIds, now, staffId(ctx, "accounts@ostrevane.example"));
  await numberUnnumberedReceipts(db);
  const documentCount = await seedDocuments(db);

  // The payment processor's side of the seeded payments, loaded into the local fake on start.
  writeFileSync(path.resolve(dataDir, "seed-processor-records.json"), JSON.stringify(ctx.processorRecords, null, 1));
  if (!opts.quiet) {
    console.log(`Seeded ${DEMO_USERS.length} users, ${FIRMS.length} firms, ${DEMO_REQUESTS.length} requests, ${documentCount} issued documents.`);
    console.log("Demo accounts (e-mail / password):");
    for (const u of DEMO_USERS) console.log(`  ${u.role.padEnd(13)} ${u.email.padEnd(30)} ${DEMO_PASSWORDS[u.role]}`);
    console.log("Staff also type a code: `npm run demo:code -- EMAIL` prints the current one (or add the secret in lib/seed/data.ts to an authenticator app).");
  }
  return { users: DEMO_USERS.length, requests: DEMO_REQUESTS.length, processorRecords: ctx.processorRecords };
}

/** The bureau's catalogue (materials, cells, rate card) and its terms of sale; the rate card's id. */
async function seedCatalogue(db: Db, now: Date): Promise<string> {
  await db.insert(s.materials).values(defaultMaterials.map((p) => ({ key: p.key, params: p })));
  await db.insert(s.cells).values(defaultCells.map((p) => ({ key: p.key, params: p })));
  const [rateCard] = await db.insert(s.rateCards).values({ version: 1, params: defaultRateCard }).returning({ id: s.rateCards.id });
  await db.insert(s.termsOfSale).values({ version: 1, title: DEMO_TERMS.title, body: DEMO_TERMS.body, createdAt: new Date(now.getTime() - 400 * DAY) });
  return rateCard!.id;
}

/** The demo mesh of a request analysed by the real engine, once per kind, options and freight zone. */
async function analysisOf(r: DemoRequest, firms: SeededFirms, now: Date, memo: Map<string, DemoAnalysis>): Promise<DemoAnalysis> {
  const freightZone = zoneOfFirm(firms, r.firm)?.key ?? null;
  const key = `${r.mesh}|${r.material}|${r.units ?? "mm"}|${r.allowanceMm ?? defaultRateCard.defaultAllowanceMm}|${r.shellWalls ?? "solid"}|${freightZone}`;
  const hit = memo.get(key);
  if (hit) return hit;
  const m = MESHES[r.mesh];
  const bytes = binaryStl(m.make());
  const result = await analyse({
    bytes,
    fileName: m.file,
    options: { ...optionsOf(r), cureTempC: r.cureTempC ?? undefined, partCtePpmPerK: r.partCte, freightZone },
    catalogue: { materials: defaultMaterials, cells: defaultCells, rateCard: defaultRateCard },
    now,
  });
  const entry = { bytes, fileName: m.file, partName: m.name, result };
  memo.set(key, entry);
  return entry;
}

/**
 * Two maintenance blocks in the week after next (plant time): the Long Bed's screw and barrel
 * inspection all Tuesday, the router's spindle service Thursday morning. The demo's capacity view
 * shows them and its estimates go around them.
 */
async function seedMaintenance(db: Db, now: Date, productionId: string) {
  const tz = defaultRateCard.plantTimeZone ?? "UTC", start = defaultRateCard.shiftStartHour ?? 6;
  const today = new Date(`${plantDay(now, tz)}T00:00:00Z`);
  const monday = new Date(today.getTime() + (((8 - today.getUTCDay()) % 7 || 7) + 7) * DAY);
  const at = (days: number, hour: number) => new Date(zonedToUtc(monday.getUTCFullYear(), monday.getUTCMonth(), monday.getUTCDate() + days, hour, tz));
  await db.insert(s.maintenanceBlocks).values([
    { resourceKey: "long-bed", startsAt: at(1, start), endsAt: at(1, start + 16), reason: "Screw and barrel inspection", createdById: productionId, createdAt: now },
    { resourceKey: ROUTER_KEY, startsAt: at(3, start), endsAt: at(3, start + 8), reason: "Spindle bearing service", createdById: productionId, createdAt: now },
  ]);
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const url = process.env.DATABASE_URL ?? "file:./data/layerwright.db";
  const { db, client } = openDb(url, process.env.DATABASE_AUTH_TOKEN);
  seed(db)
    .then(() => client.close())
    .catch((e) => {
      console.error(`seed failed: ${e instanceof Error ? e.stack : String(e)}`);
      process.exit(1);
    });
}
