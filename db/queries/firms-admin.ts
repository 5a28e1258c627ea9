import { asc, count, eq, inArray, max, notInArray } from "drizzle-orm";
import type { Db } from "../client";
import { memberships, orders, organisations, requests, users } from "../schema";

/** Every client firm with its members (no secrets) and how much it has going on, for /admin/firms. */
export async function listFirmsForAdmin(db: Db) {
  const firms = await db
    .select({ id: organisations.id, name: organisations.name, billingContact: organisations.billingContact, billingEmail: organisations.billingEmail, defaultPoNumber: organisations.defaultPoNumber, unitsPref: organisations.unitsPref, createdAt: organisations.createdAt })
    .from(organisations)
    .orderBy(asc(organisations.name));
  if (firms.length === 0) return [];
  const ids = firms.map((f) => f.id);
  const [members, open, orderCounts, last] = await Promise.all([
    db
      .select({ orgId: memberships.orgId, name: users.name, email: users.email, role: users.role, disabledAt: users.disabledAt, joinedAt: memberships.createdAt })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(inArray(memberships.orgId, ids))
      .orderBy(asc(users.name)),
    db
      .select({ orgId: requests.orgId, n: count() })
      .from(requests)
      .where(notInArray(requests.stage, ["draft", "closed", "cancelled", "delivered"]))
      .groupBy(requests.orgId),
    db.select({ orgId: orders.orgId, n: count() }).from(orders).groupBy(orders.orgId),
    db.select({ orgId: requests.orgId, at: max(requests.updatedAt) }).from(requests).groupBy(requests.orgId),
  ]);
  const by = <T extends { orgId: string }>(rows: T[]) => new Map(rows.map((r) => [r.orgId, r]));
  const openBy = by(open);
  const ordersBy = by(orderCounts);
  const lastBy = by(last);
  return firms.map((f) => ({
    ...f,
    members: members.filter((m) => m.orgId === f.id),
    openRequests: openBy.get(f.id)?.n ?? 0,
    orders: ordersBy.get(f.id)?.n ?? 0,
    lastActivity: lastBy.get(f.id)?.at ?? null,
  }));
}
