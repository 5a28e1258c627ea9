import { NextResponse } from "next/server";
import { getDb } from "@/db/client";
import { listPendingStaffInvitations, listStaff } from "@/db/queries/staff";
import { requirePermission } from "@/lib/auth/guard";
import { withErrors } from "@/lib/auth/route";

export const dynamic = "force-dynamic";

export const GET = withErrors(async () => {
  await requirePermission("admin:staff");
  const db = getDb();
  const [rows, invitations] = await Promise.all([listStaff(db), listPendingStaffInvitations(db)]);
  const now = Date.now();
  return NextResponse.json({ rows, invitations: invitations.map((i) => ({ ...i, isExpired: i.expiresAt.getTime() <= now })) });
});
