import { EstimateInputError } from "../errors";
import { unitSymbol, type LengthUnitInfo } from "./step-units";

/**
 * A check of an IGES file's fixed-form ASCII layout before it reaches the CAD kernel.
 * Layout from the Initial Graphics Exchange Specification 5.3 (1996), §2.1–2.2 (from memory):
 * 80-column records, columns 1–72 data, column 73 the section letter (S start, G global,
 * D directory entry — two records per entity, P parameter data, T terminate), columns 74–80 the
 * record's sequence number within its section. The one T record holds the count of S, G, D and
 * P records (columns 2–8, 10–16, 18–24, 26–32), so a truncated or spliced file is found exactly.
 */

const ORDER = "SGDPT";

/** Global parameter 14, model units flag, and the names parameter 15 may carry (IGES 5.3 §2.2.4.3, from memory). */
const UNIT_FLAG_MM: Record<number, number> = { 1: 25.4, 2: 1, 4: 304.8, 5: 1_609_344, 6: 1000, 7: 1e6, 8: 0.0254, 9: 1e-3, 10: 10, 11: 2.54e-5 };
const UNIT_NAME_MM: Record<string, number> = { IN: 25.4, INCH: 25.4, MM: 1, FT: 304.8, MI: 1_609_344, M: 1000, KM: 1e6, MIL: 0.0254, UM: 1e-3, MICRON: 1e-3, CM: 10, UIN: 2.54e-5 };

function fail(code: string, message: string): never {
  throw new EstimateInputError(`iges:${code}`, message);
}

export interface IgesLayout {
  unit: LengthUnitInfo;
  entityCount: number;
}

/** Records of the file: lines, or bare 80-byte records when the file has no line breaks. */
function records(text: string): string[] {
  if (!text.slice(0, 200).includes("\n") && text.length % 80 === 0) {
    const out: string[] = [];
    for (let k = 0; k < text.length; k += 80) out.push(text.slice(k, k + 80));
    return out;
  }
  const lines = text.split("\n").map((l) => (l.endsWith("\r") ? l.slice(0, -1) : l));
  while (lines.length > 0 && lines[lines.length - 1]!.trim() === "") lines.pop();
  return lines;
}

export function scanIges(bytes: Uint8Array): IgesLayout {
  if (bytes.length === 0) fail("empty", "The IGES file is empty.");
  const text = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString("latin1");
  const recs = records(text);
  const first = recs[0] ?? "";
  const letter0 = first[72];
  if (letter0 === "B") fail("binary", "The file is binary-form IGES; export it as ASCII IGES (fixed 80-column form) instead.");
  if (letter0 === "C") fail("compressed", "The file is compressed-form IGES; export it as ASCII IGES (fixed 80-column form) instead.");
  if (first.length < 73 || letter0 !== "S") fail("not-iges", 'The file is not an IGES file: its first record has no "S" in column 73.');

  const counts: Record<string, number> = { S: 0, G: 0, D: 0, P: 0, T: 0 };
  let section = 0;
  let global = "";
  for (let n = 0; n < recs.length; n++) {
    const r = recs[n]!;
    const letter = r[72] ?? "";
    const at = ORDER.indexOf(letter);
    if (r.length < 73 || at < 0) fail(n === recs.length - 1 ? "truncated" : "broken-record", `The IGES file is broken at line ${n + 1}: column 73 holds no section letter${n === recs.length - 1 ? " (the file looks truncated)" : ""}.`);
    if (at < section) fail("broken-record", `The IGES file is broken at line ${n + 1}: a "${letter}" record comes after the "${ORDER[section]}" section.`);
    section = at;
    counts[letter]!++;
    const seq = Number(r.slice(73, 80).trim());
    if (r.length >= 80 && seq !== counts[letter]) fail("broken-record", `The IGES file is broken at line ${n + 1}: "${letter}" record number ${seq} where ${counts[letter]} was expected.`);
    if (letter === "G") global += r.slice(0, 72);
  }
  const t = recs[recs.length - 1]!;
  if (t[72] !== "T") fail("truncated", 'The IGES file is truncated: it does not end with its "T" (terminate) record.');
  const declared = { S: Number(t.slice(1, 8)), G: Number(t.slice(9, 16)), D: Number(t.slice(17, 24)), P: Number(t.slice(25, 32)) };
  for (const k of ["S", "G", "D", "P"] as const) {
    if (declared[k] !== counts[k]) fail("truncated", `The IGES file is truncated or spliced: its terminate record counts ${declared[k]} "${k}" records but the file has ${counts[k]}.`);
  }
  if (counts.D! % 2 !== 0) fail("broken-record", "The IGES file's directory section has an odd number of records (each entity takes two).");
  if (counts.D === 0) fail("empty", "The IGES file has no entities.");
  return { unit: igesUnit(global), entityCount: counts.D! / 2 };
}

/** Split the global section into its parameters (Hollerith strings `nH…` taken verbatim). */
export function globalParams(g: string): string[] {
  let delim = ",";
  let pos = 0;
  const out: string[] = [];
  // Parameters 1 and 2 may redefine the delimiters ("1H," form) or be empty (defaults , and ;).
  for (let p = 0; p < 2; p++) {
    if (g.startsWith("1H", pos)) {
      const ch = g[pos + 2]!;
      if (p === 0) delim = ch;
      out.push(ch);
      pos += 3;
    } else out.push("");
    if (g[pos] === delim) pos++;
  }
  const recordDelim = out[1] || ";";
  while (pos < g.length && out.length < 30) {
    const h = /^\s*(\d+)H/.exec(g.slice(pos, pos + 12));
    let value: string;
    if (h) {
      const n = Number(h[1]);
      const from = pos + h[0].length;
      value = g.slice(from, from + n);
      pos = from + n;
    } else {
      let end = pos;
      while (end < g.length && g[end] !== delim && g[end] !== recordDelim) end++;
      value = g.slice(pos, end).trim();
      pos = end;
    }
    out.push(value);
    if (g[pos] === recordDelim) break;
    pos++;
  }
  return out;
}

function igesUnit(global: string): LengthUnitInfo {
  const p = globalParams(global);
  const flag = Number(p[13]);
  const name = (p[14] ?? "").trim().toUpperCase();
  const mm = flag === 3 ? UNIT_NAME_MM[name] : UNIT_FLAG_MM[flag];
  if (mm === undefined) return { symbol: "unknown", mmPerUnit: Number.NaN };
  return { symbol: unitSymbol(mm, name), mmPerUnit: mm };
}
