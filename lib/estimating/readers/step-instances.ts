import { EstimateInputError, LIMITS } from "../errors";
import type { StepLayout } from "./step-scan";

/**
 * How many instances a STEP file's product structure expands to, counted from the entity list
 * before the CAD kernel sees the file (ISO 10303-44 product structure, ISO 10303-43 mapped items):
 *
 * - `NEXT_ASSEMBLY_USAGE_OCCURRENCE(id, name, description, #parent, #child, …)`: one occurrence
 *   of the child product definition in the parent;
 * - `PRODUCT_DEFINITION_SHAPE(…, #definition)` with `SHAPE_DEFINITION_REPRESENTATION(#pds, #rep)`:
 *   a product definition's shape (not an instance: it links the two levels);
 * - a representation listing `MAPPED_ITEM(name, #map, #target)` among its items, with
 *   `REPRESENTATION_MAP(#origin, #mapped_representation)`: one more copy of that representation.
 *
 * The kernel expands every occurrence of every level into its own body, so nested instancing
 * multiplies: a few kilobytes can name billions of bodies. The count is memoised per entity (a
 * shared sub-assembly is visited once) and stops as soon as it passes the limit.
 */

const TYPES = /#(\d+)\s*=\s*([A-Z][A-Z0-9_]*)\s*\(/g;
const MAX_DEPTH = 64;

function fail(code: string, message: string): never {
  throw new EstimateInputError(`step:${code}`, message);
}

function refsOf(args: string): number[] {
  const out: number[] = [];
  for (const m of args.replace(/'(?:[^']|'')*'/g, "").matchAll(/#(\d+)/g)) out.push(Number(m[1]));
  return out;
}

/** Instances the file expands to (occurrences and mapped copies, each root counted once). */
export function stepInstanceCount(bytes: Uint8Array, layout: StepLayout, limit: number = LIMITS.maxComponentInstances): number {
  const text = Buffer.from(bytes.buffer, bytes.byteOffset + layout.dataStart, layout.dataEnd - layout.dataStart).toString("latin1");
  /** Edges from a node: [child, counts as an instance]. */
  const edges = new Map<number, [number, boolean][]>();
  const addEdge = (from: number, to: number, instance: boolean) => {
    let list = edges.get(from);
    if (!list) edges.set(from, (list = []));
    list.push([to, instance]);
  };
  const mappedItemMap = new Map<number, number>();
  const mapTarget = new Map<number, number>();
  const pdsDefinition = new Map<number, number>();
  const representationItems: [number, number[]][] = [];
  const sdr: [number, number][] = [];

  TYPES.lastIndex = 0;
  for (let m = TYPES.exec(text); m; m = TYPES.exec(text)) {
    const type = m[2]!;
    const relevant =
      type === "NEXT_ASSEMBLY_USAGE_OCCURRENCE" || type === "MAPPED_ITEM" || type === "REPRESENTATION_MAP" || type === "PRODUCT_DEFINITION_SHAPE" || type === "SHAPE_DEFINITION_REPRESENTATION" || type.endsWith("REPRESENTATION");
    if (!relevant) continue;
    const end = text.indexOf(";", TYPES.lastIndex);
    const refs = refsOf(text.slice(TYPES.lastIndex, end < 0 ? text.length : end));
    const id = Number(m[1]);
    if (type === "NEXT_ASSEMBLY_USAGE_OCCURRENCE" && refs.length >= 2) addEdge(refs[0]!, refs[1]!, true);
    else if (type === "MAPPED_ITEM" && refs.length >= 1) mappedItemMap.set(id, refs[0]!);
    else if (type === "REPRESENTATION_MAP" && refs.length >= 2) mapTarget.set(id, refs[1]!);
    else if (type === "PRODUCT_DEFINITION_SHAPE" && refs.length >= 1) pdsDefinition.set(id, refs[refs.length - 1]!);
    else if (type === "SHAPE_DEFINITION_REPRESENTATION" && refs.length >= 2) sdr.push([refs[0]!, refs[1]!]);
    else if (type.endsWith("REPRESENTATION")) representationItems.push([id, refs]);
    if (end >= 0) TYPES.lastIndex = end + 1;
  }
  for (const [pds, rep] of sdr) {
    const definition = pdsDefinition.get(pds);
    if (definition !== undefined) addEdge(definition, rep, false);
  }
  for (const [rep, refs] of representationItems) {
    for (const ref of refs) {
      const map = mappedItemMap.get(ref);
      const target = map === undefined ? undefined : mapTarget.get(map);
      if (target !== undefined) addEdge(rep, target, true);
    }
  }
  if (edges.size === 0) return 0;

  const hasParent = new Set<number>();
  for (const list of edges.values()) for (const [to] of list) hasParent.add(to);
  const memo = new Map<number, number>();
  const open = new Set<number>();
  const tooMany = () =>
    fail(
      "too-many-instances",
      `The STEP file's assembly expands to more than ${limit.toLocaleString("en-GB")} part instances; send the parts to be printed without nested copies.`,
    );
  /** Instances below `node` (not counting itself). */
  const below = (node: number, depth: number): number => {
    const known = memo.get(node);
    if (known !== undefined) return known;
    if (depth > MAX_DEPTH) fail("deep-assembly", `The STEP file's assembly nests more than ${MAX_DEPTH} levels deep.`);
    if (open.has(node)) fail("cyclic-assembly", "The STEP file's assembly contains itself (a cycle of occurrences or mapped items).");
    open.add(node);
    let n = 0;
    for (const [to, instance] of edges.get(node) ?? []) {
      n += (instance ? 1 : 0) + below(to, depth + 1);
      if (n > limit) tooMany();
    }
    open.delete(node);
    memo.set(node, n);
    return n;
  };
  let total = 0;
  for (const node of edges.keys()) {
    if (hasParent.has(node)) continue;
    total += 1 + below(node, 0);
    if (total > limit) tooMany();
  }
  // Every node of a cycle has a parent, so a graph that is only a cycle has no root: look there too.
  for (const node of edges.keys()) if (!memo.has(node)) below(node, 0);
  return total;
}
