import type { IndexedMesh } from "./indexed";

/**
 * One block of memory for the work arrays of the stages that follow each other on a mesh
 * (weld, topology, then slicing along each axis): each stage takes its arrays from the block
 * and is done with them before the next stage starts, so the same pages serve them all instead
 * of fresh memory for each. Sized up front for the largest stage (topology, about 4 words a triangle);
 * pages never written are never mapped. Held while the mesh lives (a WeakMap).
 */
export class WorkArena {
  private buffer: ArrayBuffer;
  constructor(words: number) { this.buffer = new ArrayBuffer(words * 4); }

  get words(): number { return this.buffer.byteLength / 4; }

  /**
   * Int32 arrays of these lengths laid end to end in the block (grown when too small). Their
   * contents are whatever the previous stage left: fill what you read before writing. The arrays
   * of an earlier call share the memory: use them no more.
   */
  int32(...lengths: number[]): Int32Array[] {
    const words = lengths.reduce((a, b) => a + b, 0);
    if (words * 4 > this.buffer.byteLength) this.buffer = new ArrayBuffer(words * 4);
    const out: Int32Array[] = [];
    let at = 0;
    for (const len of lengths) { out.push(new Int32Array(this.buffer, at * 4, len)); at += len; }
    return out;
  }
}

const arenas = new WeakMap<IndexedMesh, WorkArena>();

/** Keep `arena` as the mesh's work arena (the indexer hands over its own when large enough). */
export function adoptArena(m: IndexedMesh, arena: WorkArena): void {
  arenas.set(m, arena);
}

/** Words of a mesh's work arena: topology's 3 a triangle + 2 a vertex (weld takes fewer; slicing 1 a triangle). */
export const arenaWords = (triangles: number, vertices: number) => 3 * triangles + 2 * vertices + 1024;

/** The mesh's work arena (the indexer's, when the mesh was built by one and it is large enough). */
export function workArena(m: IndexedMesh): WorkArena {
  let a = arenas.get(m);
  if (!a) { a = new WorkArena(arenaWords(m.triangleCount, m.vertexCount)); arenas.set(m, a); }
  return a;
}
