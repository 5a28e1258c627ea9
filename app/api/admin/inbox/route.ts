import { listInbox } from "@/db/queries/sales-requests";
import { inboxOrder } from "@/lib/quoting/stats";
import { inboxAnswer } from "@/lib/contracts/admin";
import { defineRoute } from "@/lib/server/define-route";

export const dynamic = "force-dynamic";

/** Submitted requests (and stale quotes), nearest due date first, then oldest. */
export const GET = defineRoute({ access: "sales:inbox", response: inboxAnswer }, async ({ db }) => ({ rows: inboxOrder(await listInbox(db)) }));
