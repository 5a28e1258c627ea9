import type { z } from "zod";
import { dataVersion, type Db } from "@/db/client";
import { boardVersion } from "@/db/queries/orders";
import { listRequestsForScope } from "@/db/queries/requests";
import { STAGES, type Stage } from "@/db/schema/common";
import { AppError } from "@/lib/errors";
import { VersionedCache } from "@/lib/orders/board-cache";
import { portalList } from "@/lib/contracts/portal";
import { checkedAnswer, defineRoute } from "@/lib/server/define-route";
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
  // The whole answer is served again while nothing was committed to the database since it was built
  // (the version is read first: a change landing meanwhile makes the next request build afresh).
  const version = dataVersion(db);
  const answerKey = version === null ? null : `${scope.orgId}:${scope.createdById ?? ""}:${JSON.stringify([q.q ?? "", stages, q.sort, q.dir, q.limit, q.offset, q.after ?? null])}`;
  let body = answerKey ? answers.get(answerKey, version!) : undefined;
  if (body === undefined) {
    body = JSON.stringify(checkedAnswer(portalList, await buildList(db, scope, stages, q)));
    if (answerKey) answers.set(answerKey, version!, body);
  }
  return new Response(body, { headers: { "content-type": "application/json", "cache-control": "no-store" } });
});

async function buildList(db: Db, scope: { orgId: string; createdById?: string }, stages: Stage[], q: z.output<typeof listQuerySchema>) {
  // An unsearched count is reused while the board's change counter stands (read first, as the board does).
  const countKey = q.q?.trim() ? null : `${scope.orgId}:${scope.createdById ?? ""}:${stages.join(",")}`;
  const counter = countKey ? await boardVersion(db) : 0;
  const known = countKey ? counts.get(countKey, counter) : undefined;
  const { rows, total, next } = await listRequestsForScope(db, scope, { search: q.q, stages, sort: q.sort, dir: q.dir, limit: q.limit, offset: q.offset, after: q.after, total: known });
  if (countKey && known === undefined) counts.set(countKey, counter, total);
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
}

/**
 * Counts of unsearched lists by firm, author and stages, per process, valid while the database's
 * "board" counter is unchanged: its triggers fire on every insert and delete of a request and on
 * every change of its stage or firm, which is all such a count depends on (a request's author is
 * never changed). A search also reads the notes, which the counter does not watch: never reused.
 */
const counts = new VersionedCache<number>(2_000);

/** Whole answers by scope and query, per process (about 17 kB each at 50 rows). */
const answers = new VersionedCache<string>(500);
