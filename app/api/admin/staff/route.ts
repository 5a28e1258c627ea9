import { listPendingStaffInvitations, listStaff } from "@/db/queries/staff";
import { staffAnswer } from "@/lib/contracts/admin";
import { defineRoute } from "@/lib/server/define-route";

export const dynamic = "force-dynamic";

/** The staff and their open invitations. */
export const GET = defineRoute({ access: "admin:staff", response: staffAnswer }, async ({ db }) => {
  const [rows, invitations] = await Promise.all([listStaff(db), listPendingStaffInvitations(db)]);
  const now = Date.now();
  return { rows, invitations: invitations.map((i) => ({ ...i, isExpired: i.expiresAt.getTime() <= now })) };
});
