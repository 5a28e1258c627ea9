import { NextResponse } from "next/server";
import { getDb } from "@/db/client";
import { actualVsEstimate } from "@/db/queries/reports";
import { requirePermission } from "@/lib/auth/guard";
import { withErrors } from "@/lib/auth/route";

export const dynamic = "force-dynamic";

export const GET = withErrors(async () => {
  await requirePermission("production:board");
  return NextResponse.json(await actualVsEstimate(getDb()));
});
