import type { Db } from "../client";
import { auditLog } from "../schema";

type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

export interface AuditInput {
  actorId: string | null;
  action: string;
  entityType: string;
  entityId?: string | null;
  orgId?: string | null;
  before?: unknown;
  after?: unknown;
  ip?: string | null;
}

/** Append to the audit log; pass the transaction so the entry commits with the change. */
export async function writeAudit(db: Db | Tx, entry: AuditInput) {
  await db.insert(auditLog).values({
    actorId: entry.actorId,
    action: entry.action,
    entityType: entry.entityType,
    entityId: entry.entityId ?? null,
    orgId: entry.orgId ?? null,
    before: entry.before ?? null,
    after: entry.after ?? null,
    ip: entry.ip ?? null,
  });
}

export type { Tx };
