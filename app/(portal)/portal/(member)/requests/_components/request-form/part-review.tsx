"use client";

import { useState } from "react";
import { LazyPartViewer } from "@/components/part-viewer";
import { Button } from "@/components/ui/button";
import { Card, CardTitle } from "@/components/ui/card";
import type { EstimateResult } from "@/lib/estimating/types";
import type { UnitsPref } from "@/lib/units";
import { EstimatePanel } from "@/app/(portal)/portal/(member)/requests/_components/estimate-panel";
import { LayerChart } from "@/app/(portal)/portal/(member)/requests/_components/layer-chart";

/** One part seen: 3D preview on its cell, the layer-time chart and the estimate. */
export function PartReview({
  title,
  revisionId,
  result,
  fileUnits,
  displayUnits,
  cells,
  cureTempC,
  isPreviewOnDemand = false,
}: {
  title: string;
  revisionId: string;
  result: EstimateResult;
  fileUnits: "mm" | "in";
  displayUnits: UnitsPref;
  cells: { key: string; name: string; envelopeMm: { x: number; y: number; z: number }; verticalEnvelopeMm?: { x: number; y: number; z: number } | null }[];
  cureTempC: number | null;
  /** With several parts on one page, each 3D preview loads only when asked for (each is a WebGL scene and a mesh download). */
  isPreviewOnDemand?: boolean;
}) {
  const cell = cells.find((c) => c.key === result.cell) ?? null;
  // a vertical build stands the part along the cell's long axis, inside its cross travel
  const vertical = Boolean(result.printMode?.startsWith("vertical-") && cell?.verticalEnvelopeMm);
  const [showPreview, setShowPreview] = useState(!isPreviewOnDemand);
  return (
    <Card className="space-y-5" data-testid="part-review">
      <CardTitle>{title}</CardTitle>
      {showPreview ? (
        <LazyPartViewer
          revisionId={revisionId}
          fileUnits={fileUnits}
          displayUnits={displayUnits}
          orientation={result.orientation}
          envelopeMm={(vertical ? cell?.verticalEnvelopeMm : cell?.envelopeMm) ?? null}
          cellName={cell ? (vertical ? `${cell.name}, vertical build,` : cell.name) : null}
          allowanceMm={result.allowanceMm}
        />
      ) : (
        <div className="flex h-24 items-center justify-center rounded bg-paper-50 ring-1 ring-paper-200">
          <Button type="button" variant="secondary" onClick={() => setShowPreview(true)}>
            Show the 3D preview{cell ? ` on ${cell.name}` : ""}
          </Button>
        </div>
      )}
      <section aria-label="Layer times" className="space-y-2">
        <h4 className="text-sm font-semibold text-ink-700">Layer times (automatic estimate)</h4>
        <LayerChart layerChart={result.layerChart} minLayerTimeS={result.material.minLayerTimeS} maxLayerTimeS={result.material.maxLayerTimeS} units={displayUnits} />
      </section>
      <EstimatePanel r={result} units={displayUnits} cureTempC={cureTempC} />
    </Card>
  );
}
