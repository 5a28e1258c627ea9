import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { Db } from "../../db/client";
import { addresses, auditLog, issuedDocuments, orders, organisations, quotes, requests, stageEvents, users } from "../../db/schema";
import { defaultRateCard } from "../../lib/estimating/defaults";
import { crateFor, freightTo, zoneByKey, type FreightRules } from "../../lib/estimating/freight";
import type { EstimateResult } from "../../lib/estimating/types";
import { listPartsWithAnalysis } from "../../db/queries/parts";
import { createTestDb, type TestDb } from "../helpers/test-db";
import { dbRef, session } from "../support/integration";

vi.mock("@/lib/auth/config", async () => (await import("../support/integration")).authConfigMock);
vi.mock("@/lib/auth/session", async () => (await import("../support/integration")).sessionMock);
vi.mock("@/db/client", async (importOriginal) => (await import("../support/integration")).dbClientMock(importOriginal));
vi.mock("next/cache", async () => (await import("../support/integration")).nextCacheMock);
vi.mock("@/lib/email/notify", () => ({ notifyRequestReceived: async () => {}, notifyDepositReceived: async () => {} }));
// The payment page after acceptance is covered by portal-flow; here it must only not be reached.
vi.mock("@/lib/payments/checkout", () => ({ openCheckout: async () => ({ url: null, isComplete: false }) }));

let t: TestDb;
let db: Db;
const rules = defaultRateCard.freight as FreightRules;

beforeAll(async () => {
  t = await createTestDb({ seeded: true, now: new Date() });
  db = t.db;
  dbRef.db = db;
}, 180_000);
afterAll(() => t?.close());

const as = async (email: string) => {
  const [u] = await db.select({ id: users.id }).from(users).where(eq(users.email, email));
  session.current = { user: { id: u!.id } };
  return u!.id;
};
const firm = async (slug: string) => (await db.select().from(organisations).where(eq(organisations.slug, slug)))[0]!;
const shipTo = async (orgId: string, label: string) => (await db.select().from(addresses).where(and(eq(addresses.orgId, orgId), eq(addresses.label, label))))[0]!;

/** The quoted demo request, made acceptable again (no order, stage quoted, quote issued). */
async function freshQuote() {
  const [r] = await db.select().from(requests).where(eq(requests.projectName, "Deck hatch plug"));
  const [q] = await db.select().from(quotes).where(eq(quotes.requestId, r!.id));
  await db.delete(issuedDocuments).where(and(eq(issuedDocuments.requestId, r!.id), eq(issuedDocuments.kind, "invoice")));
  await db.delete(issuedDocuments).where(and(eq(issuedDocuments.requestId, r!.id), eq(issuedDocuments.kind, "packing_list")));
  await db.delete(orders).where(eq(orders.requestId, r!.id));
  await db.delete(stageEvents).where(and(eq(stageEvents.requestId, r!.id), eq(stageEvents.toStage, "accepted")));
  await db.update(requests).set({ stage: "quoted" }).where(eq(requests.id, r!.id));
  await db.update(quotes).set({ status: "issued", acceptedAt: null, acceptedById: null, validUntil: new Date(Date.now() + 20 * 86_400_000) }).where(eq(quotes.id, q!.id));
  return { r: r!, q: q! };
}

describe("the address book", () => {
  const good = { label: "Paint shop", line1: "7 Drydock Lane", city: "Saltcombe Reach", region: "ME", postalCode: "04590", country: "US" };

  it("refuses an address that does not validate, saying which field and why, and writes nothing", async () => {
    await as("buyer@bramblewake.example");
    const { addAddress } = await import("../../app/(portal)/portal/(member)/firm/address-actions");
    const before = await db.select().from(addresses);
    const r = await addAddress({ kind: "shipping", address: { ...good, postalCode: "4590", region: "QQ" } });
    expect(r).toMatchObject({ ok: false, code: "invalid_input" });
    if (r.ok) return;
    expect(r.fieldErrors?.["address.postalCode"]?.[0]).toMatch(/looks like five digits/);
    expect(r.fieldErrors?.["address.region"]?.[0]).toBe("QQ is not a state of United States.");
    expect(await db.select().from(addresses)).toHaveLength(before.length);
  });

  it("is the lead's: an engineer is refused, and another firm's address answers not found", async () => {
    await as("engineer@caldrith.example");
    const { addAddress, removeAddress, makeDefaultShipTo } = await import("../../app/(portal)/portal/(member)/firm/address-actions");
    expect(await addAddress({ kind: "shipping", address: good })).toMatchObject({ ok: false, code: "forbidden" });
    await as("lead@caldrith.example");
    const bw = await firm("bramblewake-boatworks");
    const gulf = await shipTo(bw.id, "Gulf yard");
    expect(await removeAddress({ id: gulf.id })).toMatchObject({ ok: false, code: "not_found:address" });
    expect(await makeDefaultShipTo({ id: gulf.id })).toMatchObject({ ok: false, code: "not_found:address" });
    expect((await shipTo(bw.id, "Gulf yard")).archivedAt).toBeNull();
  });

  it("adds, makes default and archives a shipping address, each audited", async () => {
    await as("buyer@bramblewake.example");
    const { addAddress, removeAddress, makeDefaultShipTo } = await import("../../app/(portal)/portal/(member)/firm/address-actions");
    const added = await addAddress({ kind: "shipping", address: good });
    expect(added.ok, added.ok ? "" : added.message).toBe(true);
    if (!added.ok) return;
    expect(await makeDefaultShipTo({ id: added.data.id })).toMatchObject({ ok: true });
    const bw = await firm("bramblewake-boatworks");
    const defaults = await db.select().from(addresses).where(and(eq(addresses.orgId, bw.id), eq(addresses.kind, "shipping"), eq(addresses.isDefault, true)));
    expect(defaults.map((a) => a.label)).toEqual(["Paint shop"]);
    expect(await removeAddress({ id: added.data.id })).toMatchObject({ ok: true });
    // The default passes back to a live address.
    const after = await db.select().from(addresses).where(and(eq(addresses.orgId, bw.id), eq(addresses.kind, "shipping"), eq(addresses.isDefault, true)));
    expect(after).toHaveLength(1);
    expect(after[0]!.label).not.toBe("Paint shop");
    await makeDefaultShipTo({ id: (await shipTo(bw.id, "North yard")).id });
    const actions = (await db.select({ action: auditLog.action }).from(auditLog).where(eq(auditLog.orgId, bw.id))).map((a) => a.action);
    expect(actions).toEqual(expect.arrayContaining(["address.add", "address.default", "address.remove"]));
  });
});

describe("freight by destination", () => {
  it("prices each firm's estimates to its default ship-to's zone", async () => {
    for (const [project, zone] of [["Deck hatch plug", "zone-3"], ["Fairing trim fixture", "zone-1"], ["Sandwich panel press fixture", "zone-2"]] as const) {
      const [r] = await db.select().from(requests).where(eq(requests.projectName, project));
      const [p] = await listPartsWithAnalysis(db, r!.id);
      const result = p!.analysis!.result as unknown as EstimateResult;
      expect(result.crate?.freight.zoneKey, project).toBe(zone);
      const freight = result.lines.find((l) => l.key === "freight")!;
      expect(freight.unitCents).toBe(freightTo(crateFor(result.crate!.sizeMm, result.partMassKg, rules), zoneByKey(rules, zone)!, rules).perCrateCents);
    }
  });

  it("accepting to the second ship-to re-prices the freight and the totals, and the order keeps that address", async () => {
    const { r, q } = await freshQuote();
    const buyer = await as("buyer@bramblewake.example");
    const bw = await firm("bramblewake-boatworks");
    const gulf = await shipTo(bw.id, "Gulf yard");
    const { acceptQuote } = await import("../../app/(portal)/portal/(member)/requests/[id]/actions");
    const res = await acceptQuote({ quoteId: q.id, poNumber: "BW-7781", acceptTerms: true, shipToId: gulf.id });
    expect(res.ok, res.ok ? "" : res.message).toBe(true);
    const [order] = await db.select().from(orders).where(eq(orders.requestId, r.id));
    const [p] = await listPartsWithAnalysis(db, r.id);
    const result = p!.analysis!.result as unknown as EstimateResult;
    const per = freightTo(result.crate!, zoneByKey(rules, "zone-1")!, rules).perCrateCents;
    const quoted = result.lines.find((l) => l.key === "freight")!.amountCents;
    expect(order!.shipTo).toMatchObject({ label: "Gulf yard", region: "LA", zoneKey: "zone-1", addressId: gulf.id });
    expect(order!.billTo).toMatchObject({ label: "Yard office" });
    const freightLine = order!.lines!.find((l) => l.kind === "freight")!;
    expect(freightLine).toMatchObject({ description: "Freight to Zone 1, plant region", unitCents: per });
    // Subtotal moves by the freight difference; margin follows at the quote's rate (tax is nil on this card).
    expect(order!.subtotalCents).toBe(q.subtotalCents - quoted + freightLine.amountCents);
    expect(order!.marginCents).toBe(Math.round((order!.subtotalCents! * q.marginBp) / 10_000));
    expect(order!.totalCents).toBe(order!.subtotalCents! + order!.marginCents! + order!.taxCents!);
    expect(order!.depositCents + order!.balanceCents).toBe(order!.totalCents);
    expect(order!.totalCents).toBeLessThan(q.totalCents);
    const [audit] = await db.select().from(auditLog).where(and(eq(auditLog.action, "quote.accept"), eq(auditLog.entityId, q.id)));
    expect(audit!.actorId).toBe(buyer);
    expect(audit!.after).toMatchObject({ shipTo: "Gulf yard", freightZone: "zone-1", quotedTotalCents: q.totalCents });

    // Invoices and the packing list carry the order's own figures and its ship-to.
    const { issueDocumentInTx } = await import("../../lib/documents/issue");
    await db.transaction((tx) => issueDocumentInTx(tx, { kind: "invoice", sourceId: order!.id }));
    await db.transaction((tx) => issueDocumentInTx(tx, { kind: "packing_list", sourceId: order!.id }));
    const docs = await db.select().from(issuedDocuments).where(eq(issuedDocuments.requestId, r.id));
    const inv = docs.find((d) => d.kind === "invoice")!.data;
    expect(inv.totals).toMatchObject({ subtotalCents: order!.subtotalCents, totalCents: order!.totalCents });
    expect(inv.shipTo).toMatchObject({ name: "Bramblewake Boatworks, Gulf yard" });
    expect((inv.shipTo as { lines: string[] }).lines).toEqual(expect.arrayContaining(["48 Bayou Quay", "Pellmoor, LA 70397"]));
    expect((inv.client as { lines: string[] }).lines).toEqual(expect.arrayContaining(["1 Slipway Road", "Saltcombe Reach, ME 04590"]));
    const pl = docs.find((d) => d.kind === "packing_list")!.data;
    expect(pl.shipTo).toMatchObject({ name: "Bramblewake Boatworks, Gulf yard" });
  }, 60_000);

  it("the default ship-to in the zone the quote was priced to keeps the quote's own figures", async () => {
    const { r, q } = await freshQuote();
    await as("buyer@bramblewake.example");
    const { acceptQuote } = await import("../../app/(portal)/portal/(member)/requests/[id]/actions");
    const res = await acceptQuote({ quoteId: q.id, poNumber: "BW-7782", acceptTerms: true });
    expect(res.ok, res.ok ? "" : res.message).toBe(true);
    const [order] = await db.select().from(orders).where(eq(orders.requestId, r.id));
    expect(order!.shipTo).toMatchObject({ label: "North yard", zoneKey: "zone-3" });
    expect(order!.lines).toBeNull();
    expect(order!.totalCents).toBe(q.totalCents);
  });

  it("refuses another firm's address and a firm with no ship-to, and makes no order", async () => {
    const { r, q } = await freshQuote();
    await as("buyer@bramblewake.example");
    const { acceptQuote } = await import("../../app/(portal)/portal/(member)/requests/[id]/actions");
    const cal = await firm("caldrith-aerostructures");
    const theirs = await shipTo(cal.id, "Tooling hall");
    expect(await acceptQuote({ quoteId: q.id, poNumber: "BW-1", acceptTerms: true, shipToId: theirs.id })).toMatchObject({ ok: false, code: "invalid_input" });
    const bw = await firm("bramblewake-boatworks");
    await db.update(addresses).set({ archivedAt: new Date() }).where(and(eq(addresses.orgId, bw.id), eq(addresses.kind, "shipping")));
    const none = await acceptQuote({ quoteId: q.id, poNumber: "BW-1", acceptTerms: true });
    expect(none).toMatchObject({ ok: false, code: "conflict:address" });
    await db.update(addresses).set({ archivedAt: null }).where(and(eq(addresses.orgId, bw.id), eq(addresses.kind, "shipping"), eq(addresses.label, "North yard")));
    await db.update(addresses).set({ archivedAt: null }).where(and(eq(addresses.orgId, bw.id), eq(addresses.kind, "shipping"), eq(addresses.label, "Gulf yard")));
    expect(await db.select().from(orders).where(eq(orders.requestId, r.id))).toHaveLength(0);
  });
});
