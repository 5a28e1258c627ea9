import { and, asc, desc, eq, isNull } from "drizzle-orm";
import type { Db } from "../client";
import { addresses, type Address, type AddressKind, type AddressSnapshot } from "../schema";
import type { Tx } from "./audit";
import type { AddressValues } from "../../lib/validation/address";

type Q = Db | Tx;

/** A firm's live addresses (archived ones left out), billing first, then the default ship-to, then by name. */
export async function listAddresses(q: Q, orgId: string, kind?: AddressKind): Promise<Address[]> {
  return q
    .select()
    .from(addresses)
    .where(and(eq(addresses.orgId, orgId), isNull(addresses.archivedAt), kind ? eq(addresses.kind, kind) : undefined))
    .orderBy(asc(addresses.kind), desc(addresses.isDefault), asc(addresses.label), asc(addresses.id));
}

/** One live address of the firm, or null (another firm's id is null too). */
export async function getAddress(q: Q, orgId: string, id: string): Promise<Address | null> {
  const [row] = await q.select().from(addresses).where(and(eq(addresses.id, id), eq(addresses.orgId, orgId), isNull(addresses.archivedAt)));
  return row ?? null;
}

/** The ship-to an estimate is priced to: the default shipping address, else the first, else null. */
export async function getDefaultShipTo(q: Q, orgId: string): Promise<Address | null> {
  const [row] = await listAddresses(q, orgId, "shipping");
  return row ?? null;
}

export async function getBillingAddress(q: Q, orgId: string): Promise<Address | null> {
  const [row] = await listAddresses(q, orgId, "billing");
  return row ?? null;
}

/**
 * Add an address. The firm's first shipping address becomes the default; a billing address
 * replaces the one before (archived), as a firm has one.
 */
export async function createAddress(tx: Tx, input: { orgId: string; kind: AddressKind; values: AddressValues; makeDefault?: boolean; actorId: string | null }): Promise<Address> {
  const existing = await listAddresses(tx, input.orgId, input.kind);
  if (input.kind === "billing" && existing.length) {
    await tx.update(addresses).set({ archivedAt: new Date() }).where(and(eq(addresses.orgId, input.orgId), eq(addresses.kind, "billing"), isNull(addresses.archivedAt)));
  }
  const isDefault = input.kind === "billing" || existing.length === 0 || Boolean(input.makeDefault);
  if (isDefault && input.kind === "shipping") await tx.update(addresses).set({ isDefault: false }).where(and(eq(addresses.orgId, input.orgId), eq(addresses.kind, "shipping")));
  const [row] = await tx
    .insert(addresses)
    .values({ orgId: input.orgId, kind: input.kind, ...input.values, isDefault, createdById: input.actorId })
    .returning();
  return row!;
}

export async function updateAddress(tx: Tx, orgId: string, id: string, values: AddressValues): Promise<boolean> {
  const r = await tx.update(addresses).set(values).where(and(eq(addresses.id, id), eq(addresses.orgId, orgId), isNull(addresses.archivedAt))).returning({ id: addresses.id });
  return r.length === 1;
}

export async function setDefaultShipTo(tx: Tx, orgId: string, id: string): Promise<boolean> {
  const target = await getAddress(tx, orgId, id);
  if (!target || target.kind !== "shipping") return false;
  await tx.update(addresses).set({ isDefault: false }).where(and(eq(addresses.orgId, orgId), eq(addresses.kind, "shipping")));
  await tx.update(addresses).set({ isDefault: true }).where(eq(addresses.id, id));
  return true;
}

/** Archive a shipping address (orders keep their copy); the next one becomes the default. */
export async function archiveAddress(tx: Tx, orgId: string, id: string, now: Date): Promise<boolean> {
  const target = await getAddress(tx, orgId, id);
  if (!target || target.kind !== "shipping") return false;
  await tx.update(addresses).set({ archivedAt: now, isDefault: false }).where(eq(addresses.id, id));
  if (target.isDefault) {
    const [next] = await listAddresses(tx, orgId, "shipping");
    if (next) await tx.update(addresses).set({ isDefault: true }).where(eq(addresses.id, next.id));
  }
  return true;
}

/** The copy an order keeps. */
export function snapshotOf(a: Address, zone?: { key: string; name: string } | null): AddressSnapshot {
  return {
    addressId: a.id,
    label: a.label,
    attention: a.attention,
    line1: a.line1,
    line2: a.line2,
    city: a.city,
    region: a.region,
    postalCode: a.postalCode,
    country: a.country,
    phone: a.phone,
    deliveryNotes: a.deliveryNotes,
    zoneKey: zone?.key ?? null,
    zoneName: zone?.name ?? null,
  };
}
