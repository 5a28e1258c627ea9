import "server-only";
import { and, desc, eq, gte, lte, sql } from "drizzle-orm";
import type { Db } from "../client";
import { auditLog, users } from "../schema";

export interface AuditQuery {
  actorId?: string;
  entityType?: string;
  action?: string;
  from?: Date;
  to?: Date;
  page?: number;
  pageSize?: number;
}

/** The audit log, newest first, filtered by who, what and when; paged on the server. */
export async function listAudit(db: Db, input: AuditQuery = {}) {
  const pageSize = Math.min(200, input.pageSize ?? 50);
  const page = Math.max(1, input.page ?? 1);
  const where = and(
    input.actorId ? eq(auditLog.actorId, input.actorId) : undefined,
    input.entityType ? eq(auditLog.entityType, input.entityType) : undefined,
    input.action ? eq(auditLog.action, input.action) : undefined,
    input.from ? gte(auditLog.at, input.from) : undefined,
    input.to ? lte(auditLog.at, input.to) : undefined,
  );
  const rows = await db
    .select({
      id: auditLog.id,
      at: auditLog.at,
      action: auditLog.action,
      entityType: auditLog.entityType,
      entityId: auditLog.entityId,
      actorId: auditLog.actorId,
      actorEmail: users.email,
      actorName: users.name,
      before: auditLog.before,
      after: auditLog.after,
    })
    .from(auditLog)
    .leftJoin(users, eq(users.id, auditLog.actorId))
    .where(where)
    .orderBy(desc(auditLog.at))
    .limit(pageSize)
    .offset((page - 1) * pageSize);
  const [{ total }] = (await db.select({ total: sql<number>`count(*)` }).from(auditLog).where(where)) as [{ total: number }];
  return { rows, total, page, pageSize };
}

/** Values for the filter selects. */
export async function auditFilterOptions(db: Db) {
  const actors = await db
    .selectDistinct({ id: users.id, email: users.email })
    .from(auditLog)
    .innerJoin(users, eq(users.id, auditLog.actorId));
  const entities = await db.selectDistinct({ entityType: auditLog.entityType }).from(auditLog);
  return { actors, entityTypes: entities.map((e) => e.entityType).sort() };
}
