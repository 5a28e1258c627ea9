import { statementAt, type StepLayout } from "./step-scan";

/**
 * The length unit a STEP file declares. ISO 10303-41 units: a representation context lists its
 * units in GLOBAL_UNIT_ASSIGNED_CONTEXT((#a,#b,#c)); the length one is a complex entity with
 * LENGTH_UNIT() and either SI_UNIT(prefix,.METRE.) or CONVERSION_BASED_UNIT('INCH',#m) where
 * #m = LENGTH_MEASURE_WITH_UNIT(LENGTH_MEASURE(25.4),#si). The kernel converts to millimetres
 * itself; this is read to report the source unit (and lets tests check the kernel's scaling).
 */

const SI_PREFIX_MM: Record<string, number> = {
  $: 1000,
  ".MILLI.": 1,
  ".CENTI.": 10,
  ".DECI.": 100,
  ".KILO.": 1e6,
  ".MICRO.": 1e-3,
  ".NANO.": 1e-6,
};

/** Common symbols by size of the unit in mm. */
const SYMBOLS: [number, string][] = [
  [1, "mm"],
  [10, "cm"],
  [1000, "m"],
  [25.4, "in"],
  [304.8, "ft"],
  [1e-3, "um"],
];

export interface LengthUnitInfo {
  /** "mm", "cm", "m", "in", "ft", "um", or the file's own unit name; "unknown" when none is declared. */
  symbol: string;
  /** Size of one file unit in millimetres; NaN when unknown. */
  mmPerUnit: number;
}

export function unitSymbol(mmPerUnit: number, name?: string): string {
  for (const [mm, sym] of SYMBOLS) if (Math.abs(mmPerUnit - mm) <= 1e-9 * mm) return sym;
  return name ? name.toLowerCase() : `${mmPerUnit} mm`;
}

function entityText(bytes: Uint8Array, layout: StepLayout, id: number): string {
  const at = layout.index.get(id);
  return at < 0 ? "" : statementAt(bytes, at).replace(/\s+/g, "");
}

function resolveLength(bytes: Uint8Array, layout: StepLayout, id: number, depth = 0): LengthUnitInfo | null {
  if (depth > 4) return null;
  const t = entityText(bytes, layout, id);
  if (!t.includes("LENGTH_UNIT")) return null;
  const conv = /CONVERSION_BASED_UNIT\('((?:[^']|'')*)',#(\d+)\)/.exec(t);
  if (conv) {
    const measure = entityText(bytes, layout, Number(conv[2]));
    const m = /LENGTH_MEASURE_WITH_UNIT\((?:[A-Z_]+\()?([-+0-9.Ee]+)\)?,#(\d+)\)/.exec(measure);
    if (!m) return null;
    const base = resolveLength(bytes, layout, Number(m[2]), depth + 1);
    const mm = Number(m[1]) * (base ? base.mmPerUnit : NaN);
    if (!Number.isFinite(mm) || mm <= 0) return null;
    return { symbol: unitSymbol(mm, conv[1]), mmPerUnit: mm };
  }
  const si = /SI_UNIT\((\$|\.[A-Z]+\.),\.METRE\.\)/.exec(t);
  const mm = si ? SI_PREFIX_MM[si[1]!] : undefined;
  return mm === undefined ? null : { symbol: unitSymbol(mm), mmPerUnit: mm };
}

/**
 * Every distinct length unit the file's contexts declare, in order of appearance (an assembly
 * may mix them; the kernel scales each part by its own). Empty when the file declares none.
 */
export function stepLengthUnits(bytes: Uint8Array, layout: StepLayout): LengthUnitInfo[] {
  const buf = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const found: LengthUnitInfo[] = [];
  let k = buf.indexOf("GLOBAL_UNIT_ASSIGNED_CONTEXT", layout.dataStart);
  for (let n = 0; k >= 0 && k < layout.dataEnd && n < 1000; n++) {
    const list = /^GLOBAL_UNIT_ASSIGNED_CONTEXT\s*\(\s*\(([^)]*)\)/.exec(statementAt(bytes, k, 512));
    for (const ref of list?.[1]?.match(/#\d+/g) ?? []) {
      const u = resolveLength(bytes, layout, Number(ref.slice(1)));
      if (u && !found.some((f) => f.symbol === u.symbol)) found.push(u);
    }
    k = buf.indexOf("GLOBAL_UNIT_ASSIGNED_CONTEXT", k + 1);
  }
  return found;
}
