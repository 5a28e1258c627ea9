import { NextResponse } from "next/server";
import { getDb } from "@/db/client";
import { countVersions, listRateCardVersions } from "@/db/queries/admin-catalogue";
import { getCurrentRateCard, listCurrentCells, listCurrentMaterials } from "@/db/queries/catalogue";
import { requirePermission } from "@/lib/auth/guard";
import { withErrors } from "@/lib/auth/route";

export const dynamic = "force-dynamic";

export const GET = withErrors(async () => {
  await requirePermission("admin:catalogue");
  const db = getDb();
  const [materials, cells, rateCard, rateCards, versions] = await Promise.all([
    listCurrentMaterials(db, { activeOnly: false }),
    listCurrentCells(db, { activeOnly: false }),
    getCurrentRateCard(db),
    listRateCardVersions(db),
    countVersions(db),
  ]);
  return NextResponse.json({
    materials: materials.map((m) => ({ ...m, versions: versions.materials.get(m.key) ?? 1 })),
    cells: cells.map((c) => ({ ...c, versions: versions.cells.get(c.key) ?? 1 })),
    rateCard,
    rateCards,
  });
});
