/**
 * Demo seed: the invented scenario of DESIGN.md. Wipes the tables and writes the bureau's
 * catalogue, the three client firms, one user per role and one request in every stage, each with
 * a generated mesh analysed by the real engine. Run: `npm run db:migrate && npm run db:seed`.
 */
import { createHash, randomUUID } from "node:crypto";
import { writeFileSync } from "node:fs";
import path from "node:path";
import { eq, sql } from "drizzle-orm";
import { analyse } from "@/lib/estimating/analyse";
import { defaultCells, defaultMaterials, defaultRateCard } from "@/lib/estimating/defaults";
import type { EstimateResult } from "@/lib/estimating/types";
import { hashPassword } from "@/lib/auth/password";
import { FLOW } from "@/lib/orders/stages";
import { shareOfCents } from "@/lib/money";
import { binaryStl, drillFixture, hullPlugInches, layupMold, tooLongBeam, extrude, type IndexedMesh } from "@/mocks/fixtures/meshes";
import { openDb, type Db } from "@/db/client";
import { numberUnnumberedReceipts } from "@/db/queries/payments";
import * as s from "@/db/schema";
import type { Stage } from "@/db/schema/common";
import { DEMO_PASSWORDS, DEMO_REQUESTS, DEMO_TOTP_SECRETS, DEMO_USERS, FIRM_ADDRESSES, FIRM_TERMS, FIRMS, type DemoMeshKey, type DemoRequest } from "./data";
import { seedProcurement } from "./procurement";
import { snapshotOf } from "@/db/queries/addresses";
import { zoneFor } from "@/lib/estimating/freight";
import { DEMO_TERMS, seedDocuments } from "./documents";
import { processorRecordsFor, type SeedProcessorRecord } from "./processor";
import { FileStore } from "@/mocks/uploadthing/store";
import { ROUTER_KEY } from "@/lib/estimating/placement";
import { zonedToUtc } from "@/lib/estimating/schedule";
import { plantDay } from "@/lib/scheduling/reschedule";

const DAY = 86_400_000;

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
  const fileBaseUrl = opts.fileBaseUrl ?? process.env.UPLOADTHING_FILE_BASE_URL ?? "http://localhost:4030/f";
  // Demo files go straight into the local upload fake's store, as if uploaded through it.
  const files = new FileStore(dataDir);

  for (const table of WIPE_ORDER) await db.run(sql.raw(`DELETE FROM ${table}`));

  // ---- catalogue ----
  const matRows = defaultMaterials.map((p) => ({ key: p.key, params: p }));
  await db.insert(s.materials).values(matRows);
  await db.insert(s.cells).values(defaultCells.map((p) => ({ key: p.key, params: p })));
  const [rateCard] = await db.insert(s.rateCards).values({ version: 1, params: defaultRateCard }).returning({ id: s.rateCards.id });
  const catalogue = { materials: defaultMaterials, cells: defaultCells, rateCard: defaultRateCard };
  await db.insert(s.termsOfSale).values({ version: 1, title: DEMO_TERMS.title, body: DEMO_TERMS.body, createdAt: new Date(now.getTime() - 400 * DAY) });

  // ---- firms and users ----
  const orgIds = new Map<string, string>();
  for (const f of FIRMS) {
    const [row] = await db
      .insert(s.organisations)
      .values({
        name: f.name, slug: f.slug, unitsPref: f.unitsPref, billingContact: f.billingContact, billingEmail: `accounts@${f.key}.example`,
        ...(FIRM_TERMS[f.key] ? { paymentTerms: FIRM_TERMS[f.key]!.terms, creditLimitCents: FIRM_TERMS[f.key]!.limitCents, termsApprovedAt: new Date(now.getTime() - 120 * DAY) } : {}),
      })
      .returning({ id: s.organisations.id });
    orgIds.set(f.key, row!.id);
  }
  // Address book: billing, then shipping (the first one the default ship-to).
  const shipTos = new Map<string, s.Address>();
  for (const f of FIRMS) {
    const book = FIRM_ADDRESSES[f.key];
    const orgId = orgIds.get(f.key)!;
    const row = (a: (typeof book.shipping)[number], kind: "billing" | "shipping", isDefault: boolean) => ({
      orgId, kind, isDefault, label: a.label, attention: a.attention ?? null, line1: a.line1, line2: a.line2 ?? null, city: a.city, region: a.region,
      postalCode: a.postalCode, country: "US", phone: a.phone ?? null, deliveryNotes: a.deliveryNotes ?? null,
    });
    await db.insert(s.addresses).values(row(book.billing, "billing", true));
    const inserted = await db.insert(s.addresses).values(book.shipping.map((a, i) => row(a, "shipping", i === 0))).returning();
    shipTos.set(f.key, inserted[0]!);
  }
  const zoneOfFirm = (firm: string) => {
    const a = shipTos.get(firm);
    return a && defaultRateCard.freight ? zoneFor(defaultRateCard.freight, a.country, a.region) : null;
  };
  const userIds = new Map<string, string>();
  const hashes = new Map<string, string>();
  for (const u of DEMO_USERS) {
    const password = DEMO_PASSWORDS[u.role];
    if (!hashes.has(password)) hashes.set(password, await hashPassword(password));
    const [row] = await db
      .insert(s.users)
      .values({
        email: u.email,
        name: u.name,
        role: u.role,
        passwordHash: hashes.get(password)!,
        isControlledCleared: Boolean(u.cleared),
        unitsPref: u.unitsPref ?? "mm",
        emailVerified: now,
      })
      .returning({ id: s.users.id });
    userIds.set(u.email, row!.id);
    const totpSecret = DEMO_TOTP_SECRETS[u.email];
    if (totpSecret) await db.insert(s.twoFactor).values({ userId: row!.id, secret: totpSecret, confirmedAt: now });
    if (u.firm) await db.insert(s.memberships).values({ orgId: orgIds.get(u.firm)!, userId: row!.id });
  }
  const staffId = (email: string) => userIds.get(email)!;

  // ---- meshes, analysed once per kind and options ----
  const analysed = new Map<string, { bytes: Uint8Array; result: EstimateResult }>();
  async function analysis(r: DemoRequest) {
    const freightZone = zoneOfFirm(r.firm)?.key ?? null;
    const key = `${r.mesh}|${r.material}|${r.units ?? "mm"}|${r.allowanceMm ?? defaultRateCard.defaultAllowanceMm}|${r.shellWalls ?? "solid"}|${freightZone}`;
    const hit = analysed.get(key);
    if (hit) return hit;
    const m = MESHES[r.mesh];
    const bytes = binaryStl(m.make());
    const result = await analyse({
      bytes,
      fileName: m.file,
      options: { ...optionsOf(r), cureTempC: r.cureTempC ?? undefined, partCtePpmPerK: r.partCte, freightZone },
      catalogue,
      now,
    });
    const entry = { bytes, result };
    analysed.set(key, entry);
    return entry;
  }

  const processorRecords: SeedProcessorRecord[] = [];
  let n = 0;
  for (const r of DEMO_REQUESTS) {
    n += 1;
    const created = new Date(now.getTime() - r.daysAgo * DAY);
    const orgId = orgIds.get(r.firm)!;
    const authorId = userIds.get(r.by)!;
    const effective = r.stage === "on_hold" ? r.heldFrom! : r.stage === "cancelled" ? "submitted" : r.stage;
    const reached = FLOW.indexOf(effective);
    const { bytes, result } = await analysis(r);
    const mesh = MESHES[r.mesh];
    const reference = `LW-${created.getUTCFullYear()}-${String(100 + n).padStart(4, "0")}`;

    await db.transaction(async (tx) => {
      const [req] = await tx
        .insert(s.requests)
        .values({
          reference,
          orgId,
          createdById: authorId,
          projectName: r.project,
          neededBy: new Date(created.getTime() + 60 * DAY),
          cureProcess: r.cure,
          cureTempC: r.cureTempC,
          partCtePpmPerK: r.partCte ?? null,
          isControlled: Boolean(r.controlled),
          notes: r.notes ?? "",
          stage: r.stage,
          heldFromStage: r.stage === "on_hold" ? r.heldFrom! : null,
          submittedAt: reached >= 1 ? new Date(created.getTime() + 0.1 * DAY) : null,
          createdAt: created,
          updatedAt: new Date(created.getTime() + reached * 0.5 * DAY),
        })
        .returning({ id: s.requests.id });
      const requestId = req!.id;

      const [part] = await tx
        .insert(s.parts)
        .values({
          requestId,
          name: mesh.name,
          materialKey: r.material,
          allowanceMm: r.allowanceMm ?? defaultRateCard.defaultAllowanceMm,
          quantity: r.quantity ?? 1,
          units: r.units ?? "mm",
          unitsConfirmed: true,
          printMode: "shell",
          shellWalls: r.shellWalls ?? 2,
          cellKey: result.cell,
          createdAt: created,
        })
        .returning({ id: s.parts.id });

      const fileKey = `seed-${randomUUID()}`;
      files.save(fileKey, Buffer.from(bytes), {
        name: mesh.file,
        type: "model/stl",
        customId: null,
        contentDisposition: "attachment",
        acl: "private",
        fileHash: createHash("md5").update(bytes).digest("hex"),
      });
      const [upload] = await tx
        .insert(s.uploads)
        .values({ fileKey, fileName: mesh.file, sizeBytes: bytes.length, url: `${fileBaseUrl}/${fileKey}`, contentType: "model/stl", userId: authorId, orgId, createdAt: created })
        .returning({ id: s.uploads.id });
      const [rev] = await tx
        .insert(s.fileRevisions)
        .values({
          partId: part!.id,
          revision: 1,
          uploadId: upload!.id,
          fileKey,
          fileName: mesh.file,
          sizeBytes: bytes.length,
          sha256: createHash("sha256").update(bytes).digest("hex"),
          format: result.format,
          uploadedById: authorId,
          createdAt: created,
        })
        .returning({ id: s.fileRevisions.id });
      await tx.update(s.parts).set({ currentRevisionId: rev!.id }).where(sql`${s.parts.id} = ${part!.id}`);
      await tx.insert(s.analyses).values({
        revisionId: rev!.id,
        status: "done",
        progress: 1,
        options: optionsOf(r),
        result,
        rateCardId: rateCard!.id,
        createdAt: created,
        finishedAt: created,
      });

      // Stage history along the flow, half a day apart.
      const events = FLOW.slice(0, reached + 1);
      for (let i = 0; i < events.length; i++) {
        await tx.insert(s.stageEvents).values({
          requestId,
          fromStage: i === 0 ? null : events[i - 1]!,
          toStage: events[i]!,
          actorId: i === 0 ? authorId : i <= 2 ? staffId("sales@ostrevane.example") : staffId("production@ostrevane.example"),
          at: new Date(created.getTime() + i * 0.5 * DAY),
        });
      }
      if (r.stage === "on_hold" || r.stage === "cancelled") {
        await tx.insert(s.stageEvents).values({
          requestId,
          fromStage: effective,
          toStage: r.stage,
          actorId: staffId("sales@ostrevane.example"),
          note: r.notes ?? (r.stage === "cancelled" ? "Cancelled at the client's request." : null),
          at: new Date(created.getTime() + (reached + 1) * 0.5 * DAY),
        });
      }

      if (reached < FLOW.indexOf("quoted")) return;
      // ---- quote ----
      const issuedAt = new Date(created.getTime() + 1 * DAY);
      const accepted = reached >= FLOW.indexOf("accepted");
      const [quote] = await tx
        .insert(s.quotes)
        .values({
          requestId,
          version: 1,
          status: accepted ? "accepted" : "issued",
          subtotalCents: result.subtotalCents,
          marginBp: defaultRateCard.marginBp,
          marginCents: result.marginCents,
          taxBp: defaultRateCard.taxBp,
          taxCents: result.taxCents,
          totalCents: result.totalCents,
          depositBp: defaultRateCard.depositBp,
          depositCents: result.depositCents,
          validityDays: defaultRateCard.quoteValidityDays,
          terms: "Deposit of half the total on acceptance; balance on shipping. Tool use stays with the client's engineering sign-off.",
          termsVersion: 1,
          shipDate: new Date(result.shipDate),
          rateCardId: rateCard!.id,
          createdById: staffId("sales@ostrevane.example"),
          issuedById: staffId("sales@ostrevane.example"),
          issuedAt,
          validUntil: new Date(issuedAt.getTime() + defaultRateCard.quoteValidityDays * DAY),
          acceptedAt: accepted ? new Date(created.getTime() + 1.5 * DAY) : null,
          acceptedById: accepted ? authorId : null,
          createdAt: issuedAt,
        })
        .returning({ id: s.quotes.id });
      await tx.insert(s.quoteLines).values(
        result.lines.map((l, i) => ({
          quoteId: quote!.id,
          partId: part!.id,
          kind: lineKind(l.key),
          description: l.label,
          quantity: l.quantity,
          unitCents: l.unitCents,
          amountCents: l.amountCents,
          estimatedCents: l.amountCents,
          sort: i,
        })),
      );
      if (!accepted) return;

      // ---- order, payments, schedule ----
      const shipped = reached >= FLOW.indexOf("shipped");
      const onAccount = r.payment === "account" ? FIRM_TERMS[r.firm] : undefined;
      const depositCents = onAccount ? 0 : result.depositCents;
      const [order] = await tx
        .insert(s.orders)
        .values({
          requestId,
          orgId,
          quoteId: quote!.id,
          poNumber: onAccount ? `${onAccount.po}-${7100 + n}` : `PO-${r.firm.slice(0, 3).toUpperCase()}-${4400 + n}`,
          paymentTerms: onAccount?.terms ?? "prepay",
          termsVersion: 1,
          shipTo: snapshotOf(shipTos.get(r.firm)!, zoneOfFirm(r.firm)),
          totalCents: result.totalCents,
          depositCents,
          balanceCents: result.totalCents - depositCents,
          cellKey: reached >= FLOW.indexOf("scheduled") ? result.cell : null,
          plannedStart: reached >= FLOW.indexOf("scheduled") ? new Date(created.getTime() + 3 * DAY) : null,
          plannedShip: reached >= FLOW.indexOf("scheduled") ? new Date(result.shipDate) : null,
          carrier: shipped ? "Tidewater Freight Lines" : null,
          trackingNumber: shipped ? `TFL${String(880_000 + n * 137)}` : null,
          actualPrintHours: reached >= FLOW.indexOf("cooling") ? round1(result.printHours * 1.08) : null,
          actualMaterialKg: reached >= FLOW.indexOf("cooling") ? round1(result.massKg * 1.04) : null,
          actualMachiningHours: reached >= FLOW.indexOf("inspection") ? round1(result.machiningHours * 0.93) : null,
          inspectionResult: reached >= FLOW.indexOf("finishing") ? "pass" : null,
          createdAt: new Date(created.getTime() + 1.5 * DAY),
        })
        .returning({ id: s.orders.id });

      const paid = reached >= FLOW.indexOf("deposit_paid");
      if (r.payment === "transfer") {
        // The deposit paid by bank transfer: matched by its reference when it arrived; no card charge at the processor.
        const at = new Date(created.getTime() + 2 * DAY);
        const transferReference = `T${createHash("sha256").update(`transfer-${n}`).digest("hex").slice(0, 9).toUpperCase()}`;
        const [dep] = await tx
          .insert(s.payments)
          .values({
            orderId: order!.id, orgId, createdById: authorId, kind: "deposit", status: paid ? "paid" : "pending", method: "bank_transfer", amountCents: depositCents,
            receivedCents: paid ? depositCents : 0, transferReference, paymentIntentId: `pi_seed_t${String(n).padStart(3, "0")}`, createdAt: new Date(created.getTime() + 1.5 * DAY), paidAt: paid ? at : null,
            transferDetails: { bankName: "Test Clearing Bank (test mode)", accountHolder: "Ostrevane Additive Works", accountNumber: "480017734210", routingNumber: "110000000", swiftCode: null },
          })
          .returning({ id: s.payments.id });
        if (paid) {
          await tx.insert(s.transferFunds).values({ processorId: `ccsbtxn_seed_${n}`, processorCustomerId: `cus_seed_${r.firm}`, orgId, paymentId: dep!.id, amountCents: depositCents, reference: transferReference, appliedCents: depositCents, status: "applied", receivedAt: at });
        }
      } else if (!onAccount) {
        const deposit = seedPayment(n, "deposit", result.depositCents, paid, new Date(created.getTime() + 2 * DAY));
        await tx.insert(s.payments).values({ orderId: order!.id, orgId, createdById: authorId, ...deposit.row });
        if (paid) processorRecords.push(...processorRecordsFor(deposit.row));
      }
      if (shipped && onAccount) {
        // On account: one invoice at shipping for the whole, still open (dated after the loop).
        await tx.insert(s.payments).values({ orderId: order!.id, orgId, createdById: authorId, kind: "balance", status: "pending", amountCents: result.totalCents, createdAt: new Date(created.getTime() + (reached - 2) * 0.5 * DAY) });
      } else if (shipped) {
        const balancePaid = reached >= FLOW.indexOf("delivered");
        const balance = seedPayment(n, "balance", result.totalCents - result.depositCents, balancePaid, new Date(created.getTime() + (reached - 2) * 0.5 * DAY));
        const [balanceRow] = await tx.insert(s.payments).values({ orderId: order!.id, orgId, createdById: authorId, ...balance.row }).returning({ id: s.payments.id });
        if (balancePaid && r.refund) {
          // A refund after delivery: the ledger, the processor's record and the credit note agree.
          const at = new Date(created.getTime() + (reached - 1) * 0.5 * DAY);
          const tag = `b${String(n).padStart(3, "0")}`;
          await tx.insert(s.refunds).values({ paymentId: balanceRow!.id, amountCents: r.refund.cents, reason: r.refund.reason, status: "succeeded", stripeRefundId: `re_seed_${tag}`, idempotencyKey: `seed-refund-${tag}`, createdById: staffId("accounts@ostrevane.example"), createdAt: at });
          await tx.update(s.payments).set({ status: "partially_refunded", refundedCents: r.refund.cents }).where(eq(s.payments.id, balanceRow!.id));
          processorRecords.push(...processorRecordsFor({ ...balance.row, status: "paid" }).map((c) => ({ ...c, refundedCents: r.refund!.cents })));
        } else if (balancePaid) processorRecords.push(...processorRecordsFor(balance.row));
      }

      if (reached >= FLOW.indexOf("scheduled")) {
        const blocks = scheduleFrom(result, printStartFor(effective, result, now));
        await tx.insert(s.scheduleBlocks).values(blocks.map((b) => ({ orderId: order!.id, cellKey: result.cell, ...b })));
      }
    });
  }

  await seedMaintenance(db, now, staffId("production@ostrevane.example"));
  await seedProcurement(db, orgIds, now, staffId("accounts@ostrevane.example"));
  await numberUnnumberedReceipts(db);
  const documentCount = await seedDocuments(db);

  // The payment processor's side of the seeded payments, loaded into the local fake on start.
  writeFileSync(path.resolve(dataDir, "seed-processor-records.json"), JSON.stringify(processorRecords, null, 1));
  if (!opts.quiet) {
    console.log(`Seeded ${DEMO_USERS.length} users, ${FIRMS.length} firms, ${DEMO_REQUESTS.length} requests, ${documentCount} issued documents.`);
    console.log("Demo accounts (e-mail / password):");
    for (const u of DEMO_USERS) console.log(`  ${u.role.padEnd(13)} ${u.email.padEnd(30)} ${DEMO_PASSWORDS[u.role]}`);
    console.log("Staff also type a code: `npm run demo:code -- EMAIL` prints the current one (or add the secret in lib/seed/data.ts to an authenticator app).");
  }
  return { users: DEMO_USERS.length, requests: DEMO_REQUESTS.length, processorRecords };
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

function optionsOf(r: DemoRequest) {
  return {
    units: r.units ?? "mm",
    materialKey: r.material,
    allowanceMm: r.allowanceMm ?? defaultRateCard.defaultAllowanceMm,
    // shells by default, wall count from the allowance (as the portal asks for it)
    printMode: "shell",
  } as const;
}

function lineKind(key: string): (typeof s.QUOTE_LINE_KINDS)[number] {
  const k = key.split(/[-_:]/)[0] ?? "";
  if (k === "dwell") return "print";
  return (s.QUOTE_LINE_KINDS as readonly string[]).includes(k) ? (k as (typeof s.QUOTE_LINE_KINDS)[number]) : "other";
}

function round1(v: number) {
  return Math.round(v * 10) / 10;
}

/** A paid or pending payment row as the webhook would have written it. Test-mode fee: 2.9 % + 30¢. */
function seedPayment(n: number, kind: "deposit" | "balance", amountCents: number, paid: boolean, at: Date) {
  const tag = `${kind === "deposit" ? "d" : "b"}${String(n).padStart(3, "0")}`;
  return {
    row: {
      kind,
      status: paid ? ("paid" as const) : ("pending" as const),
      amountCents,
      feeCents: paid ? shareOfCents(amountCents, 290) + 30 : null,
      checkoutSessionId: `cs_test_seed_${tag}`,
      paymentIntentId: paid ? `pi_seed_${tag}` : null,
      chargeId: paid ? `ch_seed_${tag}` : null,
      createdAt: at,
      paidAt: paid ? at : null,
    },
  };
}

/**
 * When the seeded job's print started, so that its blocks sit where its stage says: a scheduled
 * job prints in two days, a printing job is half-way through, later stages lie in the past.
 */
function printStartFor(stage: Stage, result: EstimateResult, now: Date): number {
  const sch = result.schedule;
  const t = (iso: string) => new Date(iso).getTime();
  const from = t(sch.printStart);
  const nowMs = now.getTime();
  const HOUR = 3_600_000;
  switch (stage) {
    case "scheduled":
      return nowMs + 2 * DAY;
    case "printing":
      return nowMs - (t(sch.printEnd) - from) / 2;
    case "cooling":
      return nowMs - (t(sch.printEnd) - from) - HOUR;
    case "machining":
      return nowMs - (t(sch.coolingEnd) - from) - 2 * HOUR;
    case "inspection":
      return nowMs - (t(sch.machiningEnd) - from) - 4 * HOUR;
    default: {
      const later = FLOW.indexOf(stage) - FLOW.indexOf("finishing");
      return nowMs - (t(sch.shipDate) - from) - (1 + 3 * later) * DAY;
    }
  }
}

function scheduleFrom(result: EstimateResult, startMs: number) {
  const sch = result.schedule;
  const base = new Date(sch.printStart).getTime();
  const shift = (iso: string) => new Date(new Date(iso).getTime() - base + startMs);
  return [
    { kind: "print" as const, startsAt: new Date(startMs), endsAt: shift(sch.printEnd) },
    { kind: "cooling" as const, startsAt: shift(sch.printEnd), endsAt: shift(sch.coolingEnd) },
    { kind: "machining" as const, startsAt: shift(sch.coolingEnd), endsAt: shift(sch.machiningEnd) },
    { kind: "finishing" as const, startsAt: shift(sch.machiningEnd), endsAt: shift(sch.shipDate) },
  ];
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
