import { boardVersion } from "@/db/queries/orders";
import { listRequestsForScope } from "@/db/queries/requests";
import { STAGES, type Stage } from "@/db/schema/common";
import { AppError } from "@/lib/errors";
import { VersionedCache } from "@/lib/orders/board-cache";
import { defineRoute } from "@/lib/server/define-route";
import { encodeListCursor } from "@/lib/validation/list-cursor";
import { listQuerySchema } from "@/lib/validation/request";

/**
 * GET /api/portal/requests?q=&stage=a,b&sort=&dir=&limit=&offset= — the firm's (client_admin) or own (client)
 * requests: `{ rows, total, nextCursor }`; `&after=<nextCursor>` gives the next page by keyset.
 */
export const GET = defineRoute({ access: "request:read_own", query: listQuerySchema, headers: { "cache-control": "no-store" } }, async ({ user, db, query: q }) => {
  if (!user.orgId) throw new AppError("forbidden", "Your account is not part of a client firm.");
  const stages = (q.stage ?? "").split(",").filter((s): s is Stage => (STAGES as readonly string[]).includes(s));
  const scope = user.role === "client_admin" ? { orgId: user.orgId } : { orgId: user.orgId, createdById: user.id };
  // An unsearched count is reused while the board's change counter stands (read first, as the board does).
  const countKey = q.q?.trim() ? null : `${scope.orgId}:${scope.createdById ?? ""}:${stages.join(",")}`;
  const version = countKey ? await boardVersion(db) : 0;
  const known = countKey ? counts.get(countKey, version) : undefined;
  const { rows, total, next } = await listRequestsForScope(db, scope, { search: q.q, stages, sort: q.sort, dir: q.dir, limit: q.limit, offset: q.offset, after: q.after, total: known });
  if (countKey && known === undefined) counts.set(countKey, version, total);
  return {
    total,
    nextCursor: next ? encodeListCursor(next) : null,
    rows: rows.map((r) => ({
      id: r.id,
      reference: r.reference,
      projectName: r.projectName,
      stage: r.stage,
      neededBy: r.neededBy?.toISOString() ?? null,
      updatedAt: r.updatedAt.toISOString(),
      isControlled: r.isControlled,
      createdByName: r.createdByName,
      partCount: Number(r.partCount),
      totalCents: r.totalCents === null ? null : Number(r.totalCents),
      hasOrder: Boolean(r.orderId),
    })),
  };
});

/**
 * Counts of unsearched lists by firm, author and stages, per process, valid while the database's
 * "board" counter is unchanged: its triggers fire on every insert and delete of a request and on
 * every change of its stage or firm, which is all such a count depends on (a request's author is
 * never changed). A search also reads the notes, which the counter does not watch: never reused.
 */
const counts = new VersionedCache<number>(2_000);
