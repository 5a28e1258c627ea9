import { EstimateInputError, LIMITS } from "../errors";
import type { Mesh } from "../types";

/**
 * Wavefront OBJ: `v x y z [w]` and `f a b c …` with `a`, `a/t`, `a//n`, `a/t/n` references,
 * 1-based, negative = relative to the end. Polygons are triangulated as a fan from their first
 * corner: for a planar polygon the fan's area vectors sum to the polygon's whatever its shape, so
 * the divergence-theorem volume and the sliced section areas stay exact; the surface area is exact
 * for convex polygons (CAD exports emit convex faces). Other statements (vn, vt, g, o, usemtl…) are skipped.
 */
export function readObj(bytes: Uint8Array): Mesh {
  const text = new TextDecoder("utf-8", { fatal: false }).decode(bytes);
  let vCap = 1 << 12;
  let verts = new Float64Array(vCap);
  let nv = 0;
  let tCap = 1 << 12;
  let tris = new Uint32Array(tCap);
  let nt = 0;
  const max = LIMITS.maxCoordinate;
  const corners: number[] = [];
  let lineNo = 0;
  let pos = 0;
  while (pos < text.length) {
    let end = text.indexOf("\n", pos);
    if (end < 0) end = text.length;
    lineNo++;
    let line = text.slice(pos, end);
    pos = end + 1;
    // line continuation
    while (line.endsWith("\\") && pos < text.length) {
      let e2 = text.indexOf("\n", pos);
      if (e2 < 0) e2 = text.length;
      line = line.slice(0, -1) + " " + text.slice(pos, e2);
      pos = e2 + 1;
      lineNo++;
    }
    const hash = line.indexOf("#");
    if (hash >= 0) line = line.slice(0, hash);
    line = line.trim();
    if (line.length === 0) continue;
    const tok = line.split(/\s+/);
    const kw = tok[0];
    if (kw === "v") {
      if (tok.length < 4) throw new EstimateInputError("obj:syntax", `OBJ line ${lineNo}: a vertex needs three coordinates.`);
      if (nv + 3 > vCap) { vCap *= 2; const n = new Float64Array(vCap); n.set(verts); verts = n; }
      for (let j = 1; j <= 3; j++) {
        const v = Number(tok[j]);
        if (Number.isNaN(v) && !/^[+-]?(nan|inf)/i.test(tok[j]!)) throw new EstimateInputError("obj:syntax", `OBJ line ${lineNo}: "${tok[j]!.slice(0, 20)}" is not a number.`);
        if (!(v <= max && v >= -max)) throw new EstimateInputError("mesh:bad-coordinate", `OBJ line ${lineNo}: a vertex coordinate is not a finite number or is absurdly large.`);
        verts[nv++] = v;
      }
    } else if (kw === "f" || kw === "fo") {
      corners.length = 0;
      const count = nv / 3;
      for (let j = 1; j < tok.length; j++) {
        const ref = tok[j]!;
        const slash = ref.indexOf("/");
        const idxText = slash >= 0 ? ref.slice(0, slash) : ref;
        const idx = Number(idxText);
        if (!Number.isInteger(idx) || idx === 0) throw new EstimateInputError("obj:bad-index", `OBJ line ${lineNo}: "${ref.slice(0, 20)}" is not a vertex index.`);
        const i0 = idx > 0 ? idx - 1 : count + idx;
        if (i0 < 0 || i0 >= count) throw new EstimateInputError("obj:bad-index", `OBJ line ${lineNo}: vertex index ${idx} is out of range (the file has ${count} vertices so far).`);
        corners.push(i0);
      }
      if (corners.length < 3) throw new EstimateInputError("obj:syntax", `OBJ line ${lineNo}: a face needs at least three vertices.`);
      const add = (corners.length - 2) * 3;
      if (nt + add > tCap) {
        while (nt + add > tCap) tCap *= 2;
        if (tCap / 3 > LIMITS.maxTriangles * 2) throw new EstimateInputError("obj:too-many", "The OBJ file has more faces than the estimator accepts.");
        const n = new Uint32Array(tCap); n.set(tris); tris = n;
      }
      for (let j = 1; j + 1 < corners.length; j++) {
        tris[nt++] = corners[0]!; tris[nt++] = corners[j]!; tris[nt++] = corners[j + 1]!;
      }
      if (nt / 3 > LIMITS.maxTriangles) throw new EstimateInputError("obj:too-many", "The OBJ file has more faces than the estimator accepts.");
    }
  }
  const triangleCount = nt / 3;
  if (triangleCount === 0) throw new EstimateInputError("obj:empty", "The OBJ file has no faces.");
  const positions = new Float32Array(nt * 3);
  for (let i = 0; i < nt; i++) {
    const v = tris[i]! * 3;
    positions[i * 3] = verts[v]!; positions[i * 3 + 1] = verts[v + 1]!; positions[i * 3 + 2] = verts[v + 2]!;
  }
  return { positions, triangleCount };
}

/** OBJ text of an indexed mesh (fixtures). */
export function writeObj(vertices: Float64Array | Float32Array, faces: Uint32Array | number[][], name = "part"): Uint8Array {
  const out: string[] = [`# ${name}\no ${name}\n`];
  for (let i = 0; i < vertices.length; i += 3) out.push(`v ${vertices[i]} ${vertices[i + 1]} ${vertices[i + 2]}\n`);
  if (faces instanceof Uint32Array) {
    for (let i = 0; i < faces.length; i += 3) out.push(`f ${faces[i]! + 1} ${faces[i + 1]! + 1} ${faces[i + 2]! + 1}\n`);
  } else {
    for (const f of faces) out.push(`f ${f.map((v) => v + 1).join(" ")}\n`);
  }
  return new TextEncoder().encode(out.join(""));
}
