import type { AnalyseOptions } from "../estimating/analyse";

/** Engine options for one part of one request (units, material, allowance, print mode…). */
export function analysisOptionsFor(
  part: {
    units: "mm" | "in";
    unitsConfirmed: boolean;
    materialKey: string;
    allowanceMm: number;
    quantity: number;
    printMode: "solid" | "shell";
    shellWalls: number;
    cellKey: string | null;
    selectedBodies?: number[] | null;
  },
  request: { cureTempC: number | null; partCtePpmPerK: number | null },
): AnalyseOptions {
  return {
    // Until the client confirms the units, the engine guesses them from the size.
    ...(part.unitsConfirmed ? { units: part.units } : {}),
    materialKey: part.materialKey,
    allowanceMm: part.allowanceMm,
    quantity: part.quantity,
    // A shell's wall count follows from the allowance and the bead (the portal does not ask for it).
    printMode: part.printMode,
    ...(part.cellKey ? { cellKey: part.cellKey } : {}),
    ...(part.selectedBodies?.length ? { bodies: part.selectedBodies } : {}),
    ...(request.cureTempC !== null ? { cureTempC: request.cureTempC } : {}),
    ...(request.partCtePpmPerK !== null ? { partCtePpmPerK: request.partCtePpmPerK } : {}),
  };
}

/** Same options, compared as data (key order does not matter). */
export function sameOptions(a: Record<string, unknown> | null | undefined, b: Record<string, unknown>): boolean {
  if (!a) return false;
  const norm = (o: Record<string, unknown>) => JSON.stringify(Object.keys(o).sort().map((k) => [k, o[k] ?? null]));
  return norm(a) === norm(b);
}
