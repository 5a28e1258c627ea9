import type { IndexedMesh } from "./indexed";
import type { BookedSpan } from "./ledger";
import type { ReadModelResult } from "./read-model";
import type { SliceAhead } from "./slice-ahead";
import type { Axis, CellParams, LengthUnit, MaterialParams, Mesh, Orientation, PrintMode, RateCardParams } from "./types";

/** What an estimate is asked for: the file (or the model already read), the client's options, the catalogue, the calendar, now. */

export interface AnalyseOptions {
  units?: LengthUnit;
  materialKey?: string;
  allowanceMm?: number;
  cellKey?: string;
  /** "shell" (the default: walls, internal ribs, skins) or "solid". */
  printMode?: PrintMode;
  /** Shell wall count set by hand; null/undefined = from the finish allowance and the bead. A number with no printMode means a shell. */
  shellWalls?: number | null;
  /** File axis that points up, or a full orientation; default: the lowest build that fits. */
  orientation?: Axis | Orientation;
  quantity?: number;
  sealingCoat?: boolean;
  vacuumTest?: boolean;
  /** Finish the face printed on the bed too (the part is flipped for a second set-up); by default it is left as printed. */
  finishBedFace?: boolean;
  /** An open mold: cut its trim line along the edge. */
  trimLines?: boolean;
  /** The client's stated cure temperature, °C (oven ≈ 120, autoclave ≈ 177). */
  cureTempC?: number;
  /** Expansion of the part laid up on the tool, ppm/K (carbon laminate ≈ 2–4). */
  partCtePpmPerK?: number;
  weldToleranceMm?: number;
  /** STEP/IGES tessellation tolerance, mm. */
  toleranceMm?: number;
  /** STEP/IGES: indices of the bodies to print; all when absent. */
  bodies?: number[];
  /** Destination zone of the rate card's freight table (the firm's default ship-to); the card's default when absent. */
  freightZone?: string | null;
}

export interface AnalyseInput {
  /** The file's bytes; or, instead, `read`: the model already read (the CLI streams it from disk). */
  bytes?: Uint8Array;
  /** A model read by `readModel`/`readModelFile` (a soup or already indexed). */
  read?: ReadModelResult<Mesh | IndexedMesh>;
  fileName: string;
  options: AnalyseOptions;
  catalogue: { materials: MaterialParams[]; cells: CellParams[]; rateCard: RateCardParams };
  now: Date;
  /**
   * Working hours of work not yet on the calendar, by cell key or `router` (taken first-fit from
   * now, with no slack): accepted, unscheduled orders, or a what-if queue.
   */
  queue?: Record<string, number>;
  /** Booked jobs and maintenance blocks on each cell (by key) and the router (`router`). */
  booked?: Record<string, BookedSpan[]>;
  /**
   * A slicing helper thread (./slice-ahead: the command line passes one): the fine sections are
   * cut on it while this thread measures. The figures are the same with or without it.
   */
  sliceAhead?: SliceAhead;
}

export type ProgressFn = (fraction: number, stage: string) => void;
