import type { MaterialParams } from "@/lib/estimating/types";

export interface CatalogueForForm {
  materials: MaterialParams[];
  cells: { key: string; name: string; envelopeMm: { x: number; y: number; z: number }; verticalEnvelopeMm?: { x: number; y: number; z: number } | null }[];
  defaultAllowanceMm: number;
  unitsPref: "mm" | "in";
}

/** What the server knows about a part's file, beside the form values. */
export interface PartFileState {
  revisionId: string | null;
  fileName: string | null;
  revision: number | null;
  analysisId: string | null;
  /** A message about this part's file (bad upload, refused content). */
  error: string | null;
}

export const emptyFileState: PartFileState = { revisionId: null, fileName: null, revision: null, analysisId: null, error: null };
