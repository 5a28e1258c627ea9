import { auditFilterOptions, listAudit } from "@/db/queries/audit-read";
import { auditAnswer } from "@/lib/contracts/admin";
import { defineRoute } from "@/lib/server/define-route";
import { auditQuerySchema } from "@/lib/validation/admin-staff";

export const dynamic = "force-dynamic";

/** The audit log, filtered by user, entity and date, paged on the server. */
export const GET = defineRoute({ access: "admin:audit", query: auditQuerySchema, response: auditAnswer }, async ({ query: q, db }) => {
  const [list, options] = await Promise.all([
    listAudit(db, { ...q, from: q.from ? new Date(`${q.from}T00:00:00Z`) : undefined, to: q.to ? new Date(`${q.to}T23:59:59.999Z`) : undefined }),
    auditFilterOptions(db),
  ]);
  return { ...list, options };
});
