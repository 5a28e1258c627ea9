import { EstimateInputError, LIMITS } from "../errors";

/**
 * The 3MF model part's XML (3MF Core Specification): objects with their mesh or components, and
 * the build items, read with two regular expressions over the tags (no DOM: a model part may be
 * hundreds of megabytes). Used by readers/threemf.ts.
 */

/** Millimetres in one of the unit words `model@unit` may take. */
export const UNIT_MM: Record<string, number> = {
  micron: 0.001, millimeter: 1, centimeter: 10, inch: 25.4, foot: 304.8, meter: 1000,
};

export interface ObjectDef {
  name: string;
  verts: Float64Array | null;
  tris: Uint32Array | null;
  components: { objectId: string; path: string | null; transform: Float64Array }[];
}

export interface ModelFile { unit: string; objects: Map<string, ObjectDef>; items: { objectId: string; path: string | null; transform: Float64Array }[] }

export const IDENTITY = new Float64Array([1, 0, 0, 0, 1, 0, 0, 0, 1, 0, 0, 0]);

export function fail(code: string, message: string): never {
  throw new EstimateInputError(code, message);
}

const TAG = /<([A-Za-z_][\w:.-]*)((?:\s+[\w:.-]+\s*=\s*(?:"[^"]{0,4096}"|'[^']{0,4096}'))*)\s*(\/?)>|<\/([A-Za-z_][\w:.-]*)\s*>/g;
const ATTR = /([\w:.-]+)\s*=\s*(?:"([^"]*)"|'([^']*)')/g;

function local(name: string): string {
  const c = name.indexOf(":");
  return c >= 0 ? name.slice(c + 1) : name;
}

export function attrs(text: string): Record<string, string> {
  const out: Record<string, string> = {};
  ATTR.lastIndex = 0;
  let m: RegExpExecArray | null;
  while ((m = ATTR.exec(text))) {
    const full = m[1]!;
    const v = m[2] ?? m[3] ?? "";
    out[full] = v;
    out[local(full)] ??= v;
  }
  return out;
}

function num(a: Record<string, string>, k: string, what: string): number {
  const v = Number(a[k]);
  if (a[k] === undefined || !Number.isFinite(v) || Math.abs(v) > LIMITS.maxCoordinate) fail("3mf:bad-number", `The 3MF model has a ${what} that is not a finite number.`);
  return v;
}

function parseTransform(s: string | undefined): Float64Array {
  if (!s) return IDENTITY;
  const parts = s.trim().split(/\s+/).map(Number);
  if (parts.length !== 12 || parts.some((v) => !Number.isFinite(v))) fail("3mf:bad-transform", "The 3MF model has a transform that is not twelve numbers.");
  return new Float64Array(parts);
}

export function compose(a: Float64Array, b: Float64Array): Float64Array {
  // apply a then b (row vectors): p·A·B
  const r = new Float64Array(12);
  for (let i = 0; i < 4; i++) {
    for (let j = 0; j < 3; j++) {
      let s = i === 3 ? b[9 + j]! : 0;
      for (let k = 0; k < 3; k++) s += a[i * 3 + k]! * b[k * 3 + j]!;
      r[i * 3 + j] = s;
    }
  }
  return r;
}

export function parseModel(xml: string): ModelFile {
  const objects = new Map<string, ObjectDef>();
  const items: ModelFile["items"] = [];
  let unit = "millimeter";
  let sawModel = false;
  let current: ObjectDef | null = null;
  let vCap = 0, nv = 0, tCap = 0, nt = 0;
  let verts = new Float64Array(0);
  let tris = new Uint32Array(0);
  TAG.lastIndex = 0;
  let m: RegExpExecArray | null;
  while ((m = TAG.exec(xml))) {
    if (m[4] !== undefined) {
      const close = local(m[4]);
      if (close === "object" && current) {
        if (nv > 0 || nt > 0) {
          for (let i = 0; i < nt; i++) if (tris[i]! >= nv / 3) fail("3mf:bad-index", `The 3MF object "${current.name}" has a triangle that names a vertex it does not have.`);
          current.verts = verts.slice(0, nv);
          current.tris = tris.slice(0, nt);
        }
        current = null;
      }
      continue;
    }
    const name = local(m[1]!);
    if (name === "vertex" && current) {
      if (nv + 3 > vCap) { vCap = Math.max(1024, vCap * 2); const n = new Float64Array(vCap); n.set(verts); verts = n; }
      const a = attrs(m[2]!);
      verts[nv++] = num(a, "x", "vertex coordinate"); verts[nv++] = num(a, "y", "vertex coordinate"); verts[nv++] = num(a, "z", "vertex coordinate");
    } else if (name === "triangle" && current) {
      if (nt + 3 > tCap) {
        tCap = Math.max(1024, tCap * 2);
        if (tCap / 3 > LIMITS.maxTriangles * 2) fail("3mf:too-many", "The 3MF model has more triangles than the estimator accepts.");
        const n = new Uint32Array(tCap); n.set(tris); tris = n;
      }
      const a = attrs(m[2]!);
      for (const k of ["v1", "v2", "v3"]) {
        const v = Number(a[k]);
        if (!Number.isInteger(v) || v < 0) fail("3mf:bad-index", "The 3MF model has a triangle whose vertex index is not a whole number.");
        tris[nt++] = v;
      }
    } else if (name === "model") {
      sawModel = true;
      const a = attrs(m[2]!);
      if (a.unit !== undefined) {
        if (!(a.unit in UNIT_MM)) fail("3mf:bad-unit", `The 3MF model's unit "${a.unit.slice(0, 20)}" is not one the 3MF specification allows.`);
        unit = a.unit;
      }
    } else if (name === "object") {
      const a = attrs(m[2]!);
      if (!a.id) fail("3mf:bad-object", "The 3MF model has an object without an id.");
      current = { name: a.name ?? `object ${a.id}`, verts: null, tris: null, components: [] };
      objects.set(a.id, current);
      nv = 0; nt = 0;
      if (m[3] === "/") current = null;
    } else if (name === "component" && current) {
      const a = attrs(m[2]!);
      if (!a.objectid) fail("3mf:bad-component", "The 3MF model has a component without an object id.");
      current.components.push({ objectId: a.objectid, path: a["p:path"] ?? a.path ?? null, transform: parseTransform(a.transform) });
    } else if (name === "item") {
      const a = attrs(m[2]!);
      if (!a.objectid) fail("3mf:bad-item", "The 3MF build has an item without an object id.");
      items.push({ objectId: a.objectid, path: a["p:path"] ?? a.path ?? null, transform: parseTransform(a.transform) });
    }
  }
  if (!sawModel) fail("3mf:no-model", "The 3MF model part has no <model> element.");
  return { unit, objects, items };
}

