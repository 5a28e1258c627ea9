import { EstimateInputError, LIMITS } from "../errors";
import type { Mesh } from "../types";

/**
 * STL readers. Layout from 3D Systems' StereoLithography Interface Specification (1988):
 * binary = 80-byte header, uint32 facet count, then per facet 12 little-endian float32
 * (normal, v1, v2, v3) and a uint16 attribute, 50 bytes a facet.
 * The file's normals are ignored: the winding defines the outside.
 */

const HEADER = 80;
const FACET = 50;

/**
 * Binary or ASCII by content, never by the header word alone: binary headers often begin
 * with "solid" (seen in CAD exports; common practice). Binary when the size matches
 * 84 + 50·n exactly; otherwise ASCII when the text has facet keywords.
 */
export function detectStl(bytes: Uint8Array): "stl-binary" | "stl-ascii" {
  if (bytes.length >= HEADER + 4) {
    const n = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength).getUint32(HEADER, true);
    if (HEADER + 4 + n * FACET === bytes.length) return "stl-binary";
  }
  const head = latin1(bytes, 0, Math.min(bytes.length, 4096)).toLowerCase();
  if (/^\s*solid\b/.test(head) && (head.includes("facet") || head.includes("endsolid"))) return "stl-ascii";
  if (bytes.length >= HEADER + 4) return "stl-binary"; // let the binary reader say what is wrong
  throw new EstimateInputError("stl:too-short", "The file is too short to be an STL file.");
}

function latin1(bytes: Uint8Array, start: number, end: number): string {
  let s = "";
  for (let i = start; i < end; i += 8192) {
    s += String.fromCharCode.apply(null, Array.from(bytes.subarray(i, Math.min(end, i + 8192))));
  }
  return s;
}

function badCoordinate(): never {
  throw new EstimateInputError("mesh:bad-coordinate", "The file has a vertex coordinate that is not a finite number (NaN or infinity) or is absurdly large.");
}

/** Reads a binary STL into a triangle soup; no object per facet. */
export function readBinaryStl(bytes: Uint8Array): Mesh {
  const n = binaryStlCount(bytes, bytes.length);
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const positions = new Float32Array(n * 9);
  decodeFacets(view, HEADER + 4, n, positions, 0);
  return { positions, triangleCount: n };
}

/**
 * Checks a binary STL's facet count against the file's size (84 + 50·n bytes) and the
 * estimator's limits; returns n. Shared by the in-memory and the streaming reader.
 */
export function binaryStlCount(header: Uint8Array, fileBytes: number): number {
  if (fileBytes < HEADER + 4 || header.length < HEADER + 4) throw new EstimateInputError("stl:too-short", "The file is too short to be a binary STL (it has no facet count).");
  const n = new DataView(header.buffer, header.byteOffset, header.byteLength).getUint32(HEADER, true);
  const expected = HEADER + 4 + n * FACET;
  if (n === 0) throw new EstimateInputError("stl:empty", "The STL file has no facets.");
  if (n > LIMITS.maxTriangles) {
    throw new EstimateInputError("stl:too-many", `The STL file claims ${n.toLocaleString("en-US")} facets, more than the ${LIMITS.maxTriangles.toLocaleString("en-US")} the estimator accepts.`);
  }
  if (fileBytes < expected) {
    throw new EstimateInputError("stl:truncated", `The STL file is truncated: its header counts ${n} facets (${expected} bytes) but the file has ${fileBytes} bytes.`);
  }
  return n;
}

/** Bytes of one binary STL facet, and of the header with the facet count. */
export const STL_FACET_BYTES = FACET;
export const STL_HEAD_BYTES = HEADER + 4;

/**
 * Decodes `count` facets starting at byte `offset` of `view` into `positions` from index `k`
 * (9 float32 a facet; the normal and the attribute word are skipped). Rejects NaN, infinite
 * and absurd coordinates.
 */
export function decodeFacets(view: DataView, offset: number, count: number, positions: Float32Array, k: number): void {
  const max = LIMITS.maxCoordinate;
  let o = offset + 12;
  for (let t = 0; t < count; t++) {
    for (let j = 0; j < 9; j++) {
      const v = view.getFloat32(o + j * 4, true);
      // NaN fails every comparison, so `!(|v| <= max)` catches NaN and ±Infinity.
      if (!(v <= max && v >= -max)) badCoordinate();
      positions[k++] = v;
    }
    o += FACET;
  }
}

/**
 * `decodeFacets` for a chunk of whole facets on a little-endian machine, reading float32 views
 * instead of a DataView (about twice as fast). A facet's floats start 4-byte aligned when the
 * facet's place in the chunk is even (50 bytes a facet) and 2 bytes off when it is odd, so
 * `shifted` holds the chunk's bytes from its third on; both arrays start 4-byte aligned and hold
 * a multiple of 4 bytes. Writes 9 float32 a facet to `out` from its start. Same checks.
 */
export function decodeFacetsAligned(chunk: Uint8Array, shifted: Uint8Array, count: number, out: Float32Array): void {
  const even = new Float32Array(chunk.buffer, chunk.byteOffset, chunk.byteLength >> 2);
  const odd = new Float32Array(shifted.buffer, shifted.byteOffset, shifted.byteLength >> 2);
  const max = LIMITS.maxCoordinate;
  let k = 0;
  for (let t = 0; t < count; t++) {
    // bytes 12 + 50t of the chunk: float 3 + 12.5t of `even` (t even), float 2.5 + 12.5t of `odd` (t odd)
    const f = (t & 1) === 0 ? even : odd;
    const i = (t & 1) === 0 ? (12 + 50 * t) >> 2 : (10 + 50 * t) >> 2;
    for (let j = 0; j < 9; j++) {
      const v = f[i + j]!;
      if (!(v <= max && v >= -max)) badCoordinate();
      out[k++] = v;
    }
  }
}

const enum Ch { Nl = 10, Cr = 13, Sp = 32, Tab = 9 }

/**
 * Reads an ASCII STL (`solid` · `facet normal` · `outer loop` · `vertex x y z` ×3 · `endloop` ·
 * `endfacet` · `endsolid`). Only `vertex` lines carry data; they must come in threes.
 */
export function readAsciiStl(bytes: Uint8Array): Mesh {
  let cap = 1 << 12;
  let positions = new Float32Array(cap);
  let k = 0;
  let line = 1;
  let i = 0;
  const len = bytes.length;
  const max = LIMITS.maxCoordinate;
  let sawSolid = false;
  while (i < len) {
    // skip blanks
    let c = bytes[i]!;
    if (c === Ch.Nl) { line++; i++; continue; }
    if (c === Ch.Sp || c === Ch.Tab || c === Ch.Cr) { i++; continue; }
    // keyword
    const ws = i;
    while (i < len) { c = bytes[i]!; if (c === Ch.Sp || c === Ch.Tab || c === Ch.Nl || c === Ch.Cr) break; i++; }
    const kw = keyword(bytes, ws, i);
    if (kw === "vertex") {
      if (k + 3 > cap) {
        if (cap * 2 > LIMITS.maxTriangles * 9) throw new EstimateInputError("stl:too-many", "The ASCII STL file has more facets than the estimator accepts.");
        const next = new Float32Array(cap * 2); next.set(positions); positions = next; cap *= 2;
      }
      for (let j = 0; j < 3; j++) {
        while (i < len && (bytes[i] === Ch.Sp || bytes[i] === Ch.Tab)) i++;
        const ns = i;
        while (i < len) { c = bytes[i]!; if (c === Ch.Sp || c === Ch.Tab || c === Ch.Nl || c === Ch.Cr) break; i++; }
        if (ns === i) throw new EstimateInputError("stl:ascii-syntax", `ASCII STL line ${line}: a vertex needs three numbers.`);
        const v = Number(latin1(bytes, ns, i));
        if (Number.isNaN(v) && !/^[+-]?(nan|inf)/i.test(latin1(bytes, ns, i))) {
          throw new EstimateInputError("stl:ascii-syntax", `ASCII STL line ${line}: "${latin1(bytes, ns, Math.min(i, ns + 20))}" is not a number.`);
        }
        if (!(v <= max && v >= -max)) badCoordinate();
        positions[k++] = v;
      }
    } else if (kw === "solid") {
      sawSolid = true;
      while (i < len && bytes[i] !== Ch.Nl) i++; // the name runs to the end of the line
    } else if (kw === "facet" || kw === "endsolid") {
      while (i < len && bytes[i] !== Ch.Nl) i++;
    } else if (kw === "outer" || kw === "loop" || kw === "endloop" || kw === "endfacet") {
      // structure only
    } else {
      throw new EstimateInputError("stl:ascii-syntax", `ASCII STL line ${line}: unexpected "${latin1(bytes, ws, Math.min(i, ws + 20))}".`);
    }
  }
  if (!sawSolid) throw new EstimateInputError("stl:ascii-syntax", "The ASCII STL file does not start with \"solid\".");
  if (k % 9 !== 0) throw new EstimateInputError("stl:ascii-syntax", "The ASCII STL file has a facet without exactly three vertices.");
  const triangleCount = k / 9;
  if (triangleCount === 0) throw new EstimateInputError("stl:empty", "The STL file has no facets.");
  return { positions: positions.slice(0, k), triangleCount };
}

function keyword(bytes: Uint8Array, s: number, e: number): string {
  if (e - s > 12) return latin1(bytes, s, s + 12);
  let out = "";
  for (let i = s; i < e; i++) out += String.fromCharCode(bytes[i]! | 0x20);
  return out;
}

/** Binary STL bytes of a triangle soup (used by fixtures, tests and the benchmark). */
export function writeBinaryStl(mesh: Mesh, header = "binary stl"): Uint8Array {
  const n = mesh.triangleCount;
  const out = new Uint8Array(HEADER + 4 + n * FACET);
  for (let i = 0; i < Math.min(header.length, HEADER); i++) out[i] = header.charCodeAt(i) & 0x7f;
  const view = new DataView(out.buffer);
  view.setUint32(HEADER, n, true);
  const p = mesh.positions;
  let o = HEADER + 4;
  for (let t = 0; t < n; t++) {
    const b = t * 9;
    const ux = p[b + 3]! - p[b]!, uy = p[b + 4]! - p[b + 1]!, uz = p[b + 5]! - p[b + 2]!;
    const vx = p[b + 6]! - p[b]!, vy = p[b + 7]! - p[b + 1]!, vz = p[b + 8]! - p[b + 2]!;
    let nx = uy * vz - uz * vy, ny = uz * vx - ux * vz, nz = ux * vy - uy * vx;
    const l = Math.hypot(nx, ny, nz) || 1;
    nx /= l; ny /= l; nz /= l;
    view.setFloat32(o, nx, true); view.setFloat32(o + 4, ny, true); view.setFloat32(o + 8, nz, true);
    for (let j = 0; j < 9; j++) view.setFloat32(o + 12 + j * 4, p[b + j]!, true);
    o += FACET;
  }
  return out;
}

/** ASCII STL text of a triangle soup. */
export function writeAsciiStl(mesh: Mesh, name = "part"): Uint8Array {
  const p = mesh.positions;
  const parts: string[] = [`solid ${name}\n`];
  for (let t = 0; t < mesh.triangleCount; t++) {
    const b = t * 9;
    parts.push("  facet normal 0 0 0\n    outer loop\n");
    for (let j = 0; j < 3; j++) parts.push(`      vertex ${p[b + j * 3]} ${p[b + j * 3 + 1]} ${p[b + j * 3 + 2]}\n`);
    parts.push("    endloop\n  endfacet\n");
  }
  parts.push(`endsolid ${name}\n`);
  return new TextEncoder().encode(parts.join(""));
}
