import { extruderOutputFor } from "../extruder";
import { leadTimeOptions } from "../lead-times";
import type { Ledger } from "../ledger";
import { downsampleLayers } from "../plan";
import { r2, r4 } from "../round";
import type { EstimateResult, MaterialParams, PieceEstimate, RateCardParams } from "../types";
import { buildModeOf } from "./candidates";
import type { PiecesPlan } from "./pieces";
import type { BuildPlan } from "./plan";
import { cellPrintRate } from "./price";

export const dryingOut = (d: BuildPlan["feed"]["drying"]) => (d ? { hours: d.hours, tempC: d.tempC, dryerKg: d.dryerKg, maxKgPerH: r2(d.maxKgPerH) } : null);

/** The estimate of a part priced as pieces: each piece's own figures, the sums at the top, the joining in the lines and the dates. */
export function asPieces(r: EstimateResult, pp: PiecesPlan, card: RateCardParams, material: MaterialParams, quantity: number, ledger: Ledger): EstimateResult {
  const out: PieceEstimate[] = pp.pieces.map((p) => {
    const c = p.chosen, bp = c.bp, sc = c.schedule;
    const own = c.pricing.lines.filter((l) => ["material", "print", "dwell", "machining", "engineering", "setup"].includes(l.key));
    return {
      index: p.index, axis: pp.axis, fromMm: r2(p.fromMm), toMm: r2(p.toMm), cell: c.cell.key, cellName: c.cell.name, printMode: buildModeOf(c), orientation: c.orientation,
      beadWidthMm: bp.beadWidthMm, layerHeightMm: bp.layerHeightMm, layers: c.sections.layerCount, flaggedLayers: bp.flaggedLayers,
      printHours: r4(bp.printHours), dwellHours: r4(bp.dwellHours), coolingHours: r4(bp.coolingHours), setupHours: (card.printSetupHours ?? 0) * bp.builds,
      depositedKg: r4(bp.depositedKg), massKg: r4(bp.massKg), partMassKg: r4(bp.partMassKg), machiningHours: r4(bp.machining.totalHours * quantity),
      drying: dryingOut(bp.feed.drying),
      schedule: {
        setupStart: sc.setupStart.toISOString(), dryingStart: sc.dryingStart.toISOString(), printStart: sc.printStart.toISOString(), printEnd: sc.printEnd.toISOString(),
        coolingEnd: sc.coolingEnd.toISOString(), machiningStart: p.machiningStart.toISOString(), machiningEnd: p.machiningEnd.toISOString(),
      },
      lines: own, subtotalCents: own.reduce((a, l) => a + l.amountCents, 0), status: c.status,
    };
  });
  const sum = (f: (p: PiecesPlan["pieces"][number]) => number) => pp.pieces.reduce((a, p) => a + f(p), 0);
  const first = pp.pieces[0]!.chosen;
  const iso = (ds: Date[], pick: "min" | "max") => new Date(pick === "min" ? Math.min(...ds.map((d) => d.getTime())) : Math.max(...ds.map((d) => d.getTime()))).toISOString();
  const scs = pp.pieces.map((p) => p.chosen.schedule);
  const mk = (k: "roughingHours" | "finishingHours" | "toolChangeHours" | "setupHours") => r4(sum((p) => p.chosen.bp.machining[k]));
  const pr = pp.pricing;
  const partMassKg = sum((p) => p.chosen.bp.partMassKg);
  const liftingCaution = partMassKg > card.liftingCautionKg;
  const heavy = r.cautions.findIndex((x) => x.startsWith("Heavy part"));
  const cautions = [...r.cautions];
  const heavyText = `Heavy part: about ${r2(partMassKg)} kg (${r2(partMassKg / 0.45359237)} lb) machined and joined, more as printed. Lift it with equipment rated for the load and follow local codes and licensed rigging practice.`;
  if (heavy >= 0) cautions[heavy] = heavyText; else if (liftingCaution) cautions.unshift(heavyText);
  const n = pp.pieces.length;
  // the whole-part plan's layer and feed warnings give way to the pieces'
  const flagged = out.filter((p) => p.flaggedLayers > 0);
  const warnings = r.warnings.filter((w) => w.code !== "layers-too-long" && w.code !== "extruder-limited").map((w) => (w.code === "fits-no-cell"
    ? { code: "priced-as-pieces", message: `The part fits no printing cell whole; it is priced as ${n} pieces along ${pp.axis} (${out.map((p) => p.cellName).join(", ")}), bonded and machined across ${pp.joint.cuts === 1 ? "the joint" : `${pp.joint.cuts} joints`}. The bureau's engineer confirms where the joints go.` }
    : w));
  if (flagged.length) warnings.push({ code: "layers-too-long", message: `${flagged.map((p) => `piece ${p.index + 1}: ${p.flaggedLayers}`).join(", ")} layers take longer than the ${material.maxLayerTimeS} s cooling window of ${material.name}; the bureau's engineer will plan them.` });
  // the whole-part plan's reasons no longer apply: the pieces are what is built
  const reviewReasons: EstimateResult["reviewReasons"] = [];
  for (const p of out) if (p.status !== "priced") reviewReasons.push({ code: "piece-outside-window", message: `Piece ${p.index + 1}: ${p.flaggedLayers} layers take longer than the cooling window.` });
  return {
    ...r,
    cell: first.cell.key, orientation: first.orientation, printMode: buildModeOf(first), beadWidthMm: first.bp.beadWidthMm, layerHeightMm: first.bp.layerHeightMm,
    shellWalls: first.bp.shellWalls, shell: first.bp.shell, speedMmS: r2(first.bp.layers.speedMmS), meanSpeedMmS: r2(first.bp.layers.meanSpeedMmS),
    layers: sum((p) => p.chosen.sections.layerCount), flaggedLayers: sum((p) => p.chosen.bp.flaggedLayers),
    printHours: r4(sum((p) => p.chosen.bp.printHours)), dwellHours: r4(sum((p) => p.chosen.bp.dwellHours)), coolingHours: r4(sum((p) => p.chosen.bp.coolingHours)),
    layerChart: downsampleLayers(first.sections.z0, first.bp.layerHeightMm, first.bp.layers),
    depositedKg: r4(sum((p) => p.chosen.bp.depositedKg)), purgeKg: r4(card.purgeKg * sum((p) => p.chosen.bp.builds)), scrapKg: r4(sum((p) => p.chosen.bp.scrapKg)),
    massKg: r4(sum((p) => p.chosen.bp.massKg)), partMassKg: r4(partMassKg), liftingCaution,
    machining: {
      ...r.machining, bedFaceMm2: r2(sum((p) => p.chosen.bp.machining.bedFaceMm2)), setups: sum((p) => p.chosen.bp.machining.setups),
      trimLengthMm: r2(sum((p) => p.chosen.bp.machining.trimLengthMm)), trimHours: r4(sum((p) => p.chosen.bp.machining.trimHours)), roughingHours: mk("roughingHours"), finishingHours: mk("finishingHours"), toolChangeHours: mk("toolChangeHours"), setupHours: mk("setupHours") },
    machiningHours: r4(sum((p) => p.chosen.bp.machining.totalHours) * quantity),
    lines: pr.lines, subtotalCents: pr.subtotalCents, marginCents: pr.marginCents, taxCents: pr.taxCents, totalCents: pr.totalCents,
    depositCents: pr.depositCents, balanceCents: pr.balanceCents,
    schedule: {
      ...r.schedule, queueHours: r2(pp.placement.waitHours),
      setupStart: iso(scs.map((x) => x.setupStart), "min"), dryingStart: iso(scs.map((x) => x.dryingStart), "min"),
      printStart: iso(scs.map((x) => x.printStart), "min"), printEnd: iso(scs.map((x) => x.printEnd), "max"), coolingEnd: iso(scs.map((x) => x.coolingEnd), "max"),
      machiningEnd: pp.joinEnd.toISOString(), shipDate: pp.shipDate,
    },
    shipDate: pp.shipDate,
    leadTimes: reviewReasons.length ? [{ key: "standard", shipDate: pp.shipDate, totalCents: pr.totalCents, adjustmentCents: 0 }] : leadTimeOptions(ledger, pp.spec, pp.placement, pr, card),
    drying: dryingOut(first.bp.feed.drying),
    feed: { kgPerH: r2(first.bp.feed.kgPerH), limitedBy: first.bp.feed.limitedBy, extruderKgPerH: extruderOutputFor(first.cell, material), screwMm: first.cell.screwMm ?? null },
    printRateCentsPerH: cellPrintRate(first.cell, card),
    batch: { partsPerBuild: 1, builds: sum((p) => p.chosen.bp.builds) },
    status: reviewReasons.length ? "needs-review" : "priced", reviewReasons, warnings, cautions,
    remedies: r.remedies.map((x) => (x.code === "split" ? { ...x, result: `each piece planned and priced on its own (${out.map((p) => p.cellName).join(", ")}), with the joining` } : x)),
    // the whole-part candidates do not fit; the pieces are the plan
    alternatives: [],
    pieces: out, joint: { cuts: pp.joint.cuts, faceAreaMm2: r2(pp.joint.faceAreaMm2), contourMm: r2(pp.joint.contourMm), hours: r4(pp.joint.hours) },
  };
}
