import { stepoverForScallop } from "../machining";
import { clearance, orientedSize, verticalCellOf } from "../orient";
import { costLine, totalsOf, type Pricing } from "../pricing";
import { placeJob, type JobPlacement, type JobSpec } from "../placement";
import type { Axis, CellParams, CostLine, Orientation, RateCardParams, SplitSuggestion } from "../types";
import { compareCandidates } from "./candidates";
import { evaluateCandidate, machiningOf, type Candidate, type PartContext, type SearchInput } from "./choose";
import { presetsOf } from "./search-space";
import type { Measured } from "./measure";
import { jobTail, printsOf, scheduleOf } from "./schedule";
import { sectionsAt, sliceStage, type GrownSections } from "./slice";

const AXIS_INDEX: Record<Axis, number> = { x: 0, y: 1, z: 2 };

/**
 * Joining a split part (rate card fields, these when a card has none): a set-up per joint, bonding
 * by the joint face's area, then the bond line machined across in a band each side of the joint at
 * the finishing stepover and feed. Invented figures of the bureau; bonding a split printed tool
 * and machining across the joint after bonding is common practice.
 */
export const JOIN_FALLBACKS = { joinSetupHours: 2, joinBondHoursPerM2: 4, joinBandMm: 150 };

/** Lines each piece bills for itself; the rest (finishing options, crate, freight) are the joined part's. */
const PIECE_LINE_KEYS = ["material", "print", "dwell", "machining", "engineering", "setup"];

export interface PlannedPiece {
  index: number;
  fromMm: number;
  toMm: number;
  ms: Measured;
  chosen: Candidate;
  /** Working hours of machining on the router, once each piece is cool; end of its machining. */
  machiningStart: Date;
  machiningEnd: Date;
  /** The net section at the piece's high cut: the joint face with the next piece. */
  highCut: { area: number; perimeter: number };
}

export interface Joint {
  /** Joints (pieces − 1) per part. */
  cuts: number;
  /** Σ joint face area, mm² (one face each joint). */
  faceAreaMm2: number;
  /** Σ joint contour length, mm. */
  contourMm: number;
  /** Bonding and machining across the joints, whole order, h. */
  hours: number;
}

export interface PiecesPlan {
  axis: Axis;
  pieces: PlannedPiece[];
  joint: Joint;
  pricing: Pricing;
  /** When the joined part is machined across its joints, and its ship date. */
  joinEnd: Date;
  shipDate: string;
  /** The pieces' prints, the joining and the days after, as placed on the calendar. */
  spec: JobSpec;
  placement: JobPlacement;
}

/**
 * A part no cell takes whole, priced as pieces: it is cut into `split.pieces` equal slabs along the
 * split axis, each keeping the finish allowance on its cut faces, and each slab is its own estimate
 * (cell, build, hours, set-up), built with its layers across the split axis (on its end on a bed
 * tall enough, or vertically along a long axis), so its sections are exactly the part's sections
 * in that slab. The slab's surface is the part's shared by side area plus its cut faces; its
 * volume the part's shared by the slab's sliced volume. Pieces on one cell print one after the
 * other; the router machines them one at a time, then bonds and machines across each joint.
 * Null when some piece fits no cell built that way (the bureau's engineer then plans the pieces).
 */
export function planPieces(s: SearchInput, cells: CellParams[], split: SplitSuggestion, fineH: number, wholePricing: Pricing): PiecesPlan | null {
  const { ms, card } = s;
  const t = s.allowanceMm, axis = split.axis, ai = AXIS_INDEX[axis], n = split.pieces;
  const lo = ms.m.bounds.min[ai]!, len = ms.netSize[ai]!;
  const slabs: { from: number; to: number; fine: GrownSections }[] = [];
  for (let i = 0; i < n; i++) {
    const from = lo + (len * i) / n, to = lo + (len * (i + 1)) / n;
    slabs.push({ from, to, fine: sliceStage(s.mesh, ms, axis, fineH, t, [from, to]) });
  }
  const volSum = slabs.reduce((a, x) => a + x.fine.slab!.netVolumeMm3, 0);
  const sideSum = slabs.reduce((a, x) => a + x.fine.slab!.sideAreaMm2, 0);
  const pieces: PlannedPiece[] = [];
  for (let i = 0; i < n; i++) {
    const { from, to, fine } = slabs[i]!;
    const sl = fine.slab!;
    const cutArea = (i > 0 ? sl.lowAreaMm2 : 0) + (i < n - 1 ? sl.highAreaMm2 : 0);
    const cutPer = (i > 0 ? sl.lowPerimeterMm : 0) + (i < n - 1 ? sl.highPerimeterMm : 0);
    const share = sideSum > 0 ? sl.sideAreaMm2 / sideSum : 1 / n;
    const volume = volSum > 0 ? ms.volumeMm3 * (sl.netVolumeMm3 / volSum) : ms.volumeMm3 / n;
    const area = ms.m.areaMm2 * share + cutArea;
    // a flat cut meets the sides at a right angle: ½ · contour · π/2 of Steiner's M (its definition)
    const M = ms.meanCurvatureMm * share + (Math.PI / 4) * cutPer;
    const netSize = [...ms.netSize] as [number, number, number];
    netSize[ai] = to - from;
    const min = [...ms.m.bounds.min] as [number, number, number], max = [...ms.m.bounds.max] as [number, number, number];
    min[ai] = from; max[ai] = to;
    const pms: Measured = {
      m: { ...ms.m, areaMm2: area, volumeMm3: volume, bounds: { min, max } }, volumeMm3: volume, meanCurvatureMm: M,
      netSize, grownSize: netSize.map((v) => v + 2 * t) as [number, number, number],
    };
    const part: PartContext = { ms: pms, machiningFor: (sec) => machiningOf(s, pms, sec) };
    const all: Candidate[] = [];
    for (const cell of cells) {
      for (const [c, vertical] of [[cell, false], [verticalCellOf(cell), true]] as [CellParams | null, boolean][]) {
        if (!c) continue;
        let best: { o: Orientation; m: number } | null = null;
        for (const swapped of [false, true]) {
          const o = { up: axis, swapped };
          const m = clearance(orientedSize(pms.grownSize, o), c);
          if (m >= 0 && (!best || m > best.m)) best = { o, m };
        }
        if (!best) continue;
        for (const preset of presetsOf(c)) {
          all.push(evaluateCandidate(s, part, c, best.o, true, sectionsAt(fine, preset.layerHeightMm), preset.beadWidthMm, s.printMode, 1, vertical));
        }
      }
    }
    if (all.length === 0) return null;
    all.sort(compareCandidates);
    pieces.push({ index: i, fromMm: from, toMm: to, ms: pms, chosen: all[0]!, machiningStart: s.now, machiningEnd: s.now, highCut: { area: sl.highAreaMm2, perimeter: sl.highPerimeterMm } });
  }

  // All the pieces' prints placed together: pieces on one cell print one after another (the next
  // set-up once the last is cool and lifted); the router machines them one at a time in the order
  // they leave their cells, then bonds and machines across the joints.
  const joint = jointOf(pieces, card, s.quantity);
  const first = pieces[0]!.chosen.cell;
  const perPiece = pieces.map((p) => printsOf(p.chosen.cell, card, p.chosen.bp, s.quantity));
  const spec: JobSpec = { prints: perPiece.flat(), joinHours: joint.hours, ...jobTail(first, card) };
  const placement = placeJob(s.ledger.fork(), spec);
  let k = 0;
  for (const [i, p] of pieces.entries()) {
    const own = placement.prints.slice(k, k + perPiece[i]!.length);
    const ownSpec: JobSpec = { ...spec, prints: spec.prints.slice(k, k + own.length), joinHours: 0 };
    k += own.length;
    const end = Math.max(...own.map((x) => x.machiningEnd));
    p.chosen = { ...p.chosen, schedule: scheduleOf({ ...placement, prints: own, machiningEnd: end }, ownSpec) };
    p.machiningStart = new Date(Math.min(...own.map((x) => x.machiningStart)));
    p.machiningEnd = new Date(end);
  }
  const joinEnd = new Date(placement.machiningEnd);
  const shipDate = placement.shipDate;

  // Lines: each piece's own summed by key, the joining, then the joined part's finishing, crate and freight.
  const lines: CostLine[] = [];
  for (const key of PIECE_LINE_KEYS) {
    const of = pieces.map((p) => p.chosen.pricing.lines.find((l) => l.key === key)).filter((l): l is CostLine => !!l);
    if (of.length === 0) continue;
    const quantity = of.reduce((a, l) => a + l.quantity, 0), amountCents = of.reduce((a, l) => a + l.amountCents, 0);
    const same = of.every((l) => l.unitCents === of[0]!.unitCents);
    lines.push({ ...of[0]!, quantity: Math.round(quantity * 1000) / 1000, unitCents: same ? of[0]!.unitCents : Math.round(amountCents / Math.max(quantity, 1e-9)), amountCents });
  }
  lines.push(costLine("joining", `Joining ${n} pieces: bonding and machining across ${joint.cuts === 1 ? "the joint" : `${joint.cuts} joints`}`, joint.hours, "h", card.machiningRateCentsPerH));
  for (const l of wholePricing.lines) if (!PIECE_LINE_KEYS.includes(l.key)) lines.push(l);
  const pricing: Pricing = { ...totalsOf(lines, card), ...(wholePricing.crate ? { crate: wholePricing.crate } : {}) };
  return { axis, pieces, joint, pricing, joinEnd, shipDate, spec, placement };
}

/** Bonding and machining across each joint: set-up, bond by face area, and a band each side of the joint contour finished at the card's stepover and feed. */
export function jointOf(pieces: PlannedPiece[], card: RateCardParams, quantity: number): Joint {
  const setup = card.joinSetupHours ?? JOIN_FALLBACKS.joinSetupHours;
  const bondPerM2 = card.joinBondHoursPerM2 ?? JOIN_FALLBACKS.joinBondHoursPerM2;
  const band = card.joinBandMm ?? JOIN_FALLBACKS.joinBandMm;
  const stepover = stepoverForScallop(card.cutterRadiusMm, card.targetScallopMm);
  let face = 0, contour = 0;
  for (let i = 0; i + 1 < pieces.length; i++) { face += pieces[i]!.highCut.area; contour += pieces[i]!.highCut.perimeter; }
  const cuts = pieces.length - 1;
  const perPart = cuts * setup + (face / 1e6) * bondPerM2 + (2 * band * contour) / (stepover * card.finishingFeedMmPerMin) / 60;
  return { cuts, faceAreaMm2: face, contourMm: contour, hours: perPart * quantity };
}
