import { unzipSync } from "fflate";
import { EstimateInputError, LIMITS } from "../errors";
import { attrs, compose, fail, parseModel, UNIT_MM, type ModelFile, type ObjectDef } from "./threemf-xml";
import type { Mesh } from "../types";

/**
 * 3MF reader (3MF Consortium, 3MF Core Specification): an OPC zip whose root relationship
 * (`_rels/.rels`, type …/3dmodel) names the model XML; `model@unit` is one of micron,
 * millimeter (default), centimeter, inch, foot, meter; `resources` > `object` > `mesh` >
 * `vertices`/`triangles`, or `object` > `components` > `component@objectid@transform`
 * (and the production extension's `p:path` into another model part); `build` > `item`.
 * Transforms are 3×4 row-vector matrices "m00 m01 m02 m10 m11 m12 m20 m21 m22 m30 m31 m32".
 */

export { UNIT_MM };

export interface ThreeMfResult {
  mesh: Mesh;
  /** The model's declared unit word. */
  unit: string;
}


function unzip(bytes: Uint8Array): Record<string, Uint8Array> {
  let total = 0;
  try {
    return unzipSync(bytes, {
      filter(file) {
        const wanted = file.name.endsWith(".rels") || file.name.toLowerCase().endsWith(".model");
        if (!wanted) return false;
        // fflate sizes its output by the declared size, so a lying header only truncates;
        // refusing large declared sizes and absurd ratios bounds memory and time.
        total += file.originalSize;
        if (file.originalSize > LIMITS.maxUnzippedBytes || total > LIMITS.maxUnzippedBytes) {
          fail("3mf:zip-bomb", "The 3MF package unpacks to more data than the estimator accepts (possible zip bomb).");
        }
        if (file.originalSize > 16 * 1024 * 1024 && file.originalSize > file.size * LIMITS.maxZipRatio) {
          fail("3mf:zip-bomb", "The 3MF package is compressed beyond any plausible ratio (possible zip bomb).");
        }
        return true;
      },
    });
  } catch (e) {
    if (e instanceof EstimateInputError) throw e;
    fail("3mf:bad-zip", "The 3MF file is not a readable zip package.");
  }
}

function rootModelPath(files: Record<string, Uint8Array>): string {
  const rels = files["_rels/.rels"];
  if (rels) {
    const xml = new TextDecoder().decode(rels);
    const re = /<(?:\w+:)?Relationship\b([^>]*)>/g;
    let m: RegExpExecArray | null;
    while ((m = re.exec(xml))) {
      const a = attrs(m[1]!);
      if (a.Type && /3dmodel$/i.test(a.Type) && a.Target) return a.Target.replace(/^\//, "");
    }
  }
  const fallback = Object.keys(files).find((k) => k.toLowerCase().endsWith(".model"));
  if (!fallback) fail("3mf:missing-model", "The 3MF package has no 3D model part.");
  return fallback;
}

/** Reads a 3MF package into one triangle soup in millimetres, one body per build item. */
export function read3mf(bytes: Uint8Array): ThreeMfResult {
  const files = unzip(bytes);
  const rootPath = rootModelPath(files);
  const models = new Map<string, ModelFile>();
  const getModel = (path: string): ModelFile => {
    const key = path.replace(/^\//, "");
    let mf = models.get(key);
    if (!mf) {
      const data = files[key];
      if (!data) fail("3mf:missing-part", `The 3MF package refers to "${key.slice(0, 80)}", which it does not contain.`);
      mf = parseModel(new TextDecoder().decode(data));
      models.set(key, mf);
    }
    return mf;
  };
  const root = getModel(rootPath);
  if (root.items.length === 0) fail("3mf:empty-build", "The 3MF model has no build items, so there is nothing to print.");
  const rootScale = UNIT_MM[root.unit]!;

  // First pass counts instances and triangles per object, once each (memoised, so a shared
  // sub-assembly costs one visit however often it is used): the soup is allocated once, and a
  // graph that expands past the limits is refused before any instance is emitted.
  const tooMany = () => fail("3mf:too-many", "The 3MF model has more triangles (after instancing) than the estimator accepts.");
  const tooManyInstances = () =>
    fail("3mf:too-many-instances", `The 3MF model's components expand to more than ${LIMITS.maxComponentInstances.toLocaleString("en-GB")} object instances; send the parts to be printed without nested copies.`);
  const counted = new Map<ModelFile, Map<string, { tris: number; instances: number }>>();
  const open = new Set<ObjectDef>();
  const count = (mf: ModelFile, id: string, depth: number): { tris: number; instances: number } => {
    if (depth > 32) fail("3mf:deep-components", "The 3MF components nest too deeply (or refer to themselves).");
    const o = mf.objects.get(id);
    if (!o) fail("3mf:missing-object", `The 3MF model refers to object ${id.slice(0, 20)}, which it does not define.`);
    let memo = counted.get(mf);
    if (!memo) counted.set(mf, (memo = new Map()));
    const known = memo.get(id);
    if (known) return known;
    if (open.has(o)) fail("3mf:deep-components", "The 3MF components nest too deeply (or refer to themselves).");
    open.add(o);
    let tris = o.tris ? o.tris.length / 3 : 0;
    let instances = 1;
    for (const c of o.components) {
      const sub = count(c.path ? getModel(c.path) : mf, c.objectId, depth + 1);
      tris += sub.tris;
      instances += sub.instances;
      if (tris > LIMITS.maxTriangles) tooMany();
      if (instances > LIMITS.maxComponentInstances) tooManyInstances();
    }
    open.delete(o);
    const result = { tris, instances };
    memo.set(id, result);
    return result;
  };
  let total = 0;
  let instances = 0;
  for (const it of root.items) {
    const sub = count(it.path ? getModel(it.path) : root, it.objectId, 0);
    total += sub.tris;
    instances += sub.instances;
    if (total > LIMITS.maxTriangles) tooMany();
    if (instances > LIMITS.maxComponentInstances) tooManyInstances();
  }
  if (total === 0) fail("3mf:empty", "The 3MF model has no triangles.");

  const positions = new Float32Array(total * 9);
  const bodyOfTriangle = new Uint32Array(total);
  const bodyNames: string[] = [];
  let k = 0;
  const emit = (mf: ModelFile, id: string, tr: Float64Array, body: number) => {
    const o = mf.objects.get(id)!;
    // Components in another part are in that part's unit; scale them to the root's.
    if (o.verts && o.tris) {
      const s = UNIT_MM[mf.unit]! / rootScale;
      const det = tr[0]! * (tr[4]! * tr[8]! - tr[5]! * tr[7]!) - tr[1]! * (tr[3]! * tr[8]! - tr[5]! * tr[6]!) + tr[2]! * (tr[3]! * tr[7]! - tr[4]! * tr[6]!);
      const flip = det < 0; // a mirroring transform turns the winding inside out
      const v = o.verts, t = o.tris;
      for (let i = 0; i < t.length; i += 3) {
        for (let j = 0; j < 3; j++) {
          const vi = t[i + (flip && j > 0 ? 3 - j : j)]! * 3;
          const x = v[vi]! * s, y = v[vi + 1]! * s, z = v[vi + 2]! * s;
          positions[k++] = (x * tr[0]! + y * tr[3]! + z * tr[6]! + tr[9]!) * rootScale;
          positions[k++] = (x * tr[1]! + y * tr[4]! + z * tr[7]! + tr[10]!) * rootScale;
          positions[k++] = (x * tr[2]! + y * tr[5]! + z * tr[8]! + tr[11]!) * rootScale;
        }
        bodyOfTriangle[(k / 9) - 1] = body;
      }
    }
    for (const c of o.components) emit(c.path ? getModel(c.path) : mf, c.objectId, compose(c.transform, tr), body);
  };
  for (const it of root.items) {
    const mf = it.path ? getModel(it.path) : root;
    bodyNames.push(mf.objects.get(it.objectId)!.name);
    emit(mf, it.objectId, it.transform, bodyNames.length - 1);
  }
  for (let i = 0; i < positions.length; i++) {
    const v = positions[i]!;
    if (!(v <= LIMITS.maxCoordinate && v >= -LIMITS.maxCoordinate)) fail("mesh:bad-coordinate", "The 3MF model has a vertex that is not a finite number after its transforms.");
  }
  return { mesh: { positions, triangleCount: total, bodyOfTriangle, bodyNames }, unit: root.unit };
}
