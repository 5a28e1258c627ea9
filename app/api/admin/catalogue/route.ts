import { countVersions, listRateCardVersions } from "@/db/queries/admin-catalogue";
import { getCurrentRateCard, listCurrentCells, listCurrentMaterials } from "@/db/queries/catalogue";
import { defineRoute } from "@/lib/server/define-route";

export const dynamic = "force-dynamic";

/** The current catalogue (active or not) with each row's version count, and the rate card's history. */
export const GET = defineRoute({ access: "admin:catalogue" }, async ({ db }) => {
  const [materials, cells, rateCard, rateCards, versions] = await Promise.all([
    listCurrentMaterials(db, { activeOnly: false }),
    listCurrentCells(db, { activeOnly: false }),
    getCurrentRateCard(db),
    listRateCardVersions(db),
    countVersions(db),
  ]);
  return {
    materials: materials.map((m) => ({ ...m, versions: versions.materials.get(m.key) ?? 1 })),
    cells: cells.map((c) => ({ ...c, versions: versions.cells.get(c.key) ?? 1 })),
    rateCard,
    rateCards,
  };
});
