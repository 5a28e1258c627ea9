import type { Mesh } from "./types";
import { adoptArena, arenaWords, WorkArena } from "./work-arena";

/**
 * A triangle mesh as its distinct corner positions and three of them per triangle. "Distinct"
 * means bit for bit: two corners share a vertex only when their float32 coordinates are the
 * same bits, so the soup is rebuilt exactly from it (`toSoup`) and every measure taken over it
 * equals the one taken over the soup. Vertices are numbered in the order their first corner
 * comes in the file. Welding within a tolerance is a later step (`weld` in ./measure).
 *
 * Why: a binary STL writes each vertex once per triangle around it (about six times), so the
 * soup is 36 bytes a triangle and this about 18 (12 of indices, ~6 of vertices); the reader
 * builds it while streaming, so the soup is never held whole.
 */
export interface IndexedMesh {
  /** 3 float32 per vertex, exactly `vertexCount` of them. */
  vertices: Float32Array;
  /** 3 vertex indices per triangle, in the file's winding. */
  indices: Uint32Array;
  vertexCount: number;
  triangleCount: number;
}

export function isIndexed(m: Mesh | IndexedMesh): m is IndexedMesh {
  return (m as IndexedMesh).indices !== undefined;
}

/** Smallest power of two ≥ v, at least 16. */
export function pow2AtLeast(v: number): number {
  let s = 16;
  while (s < v) s *= 2;
  return s;
}

const RECENT_MASK = 8191;

const hash3 = (x: number, y: number, z: number): number => {
  const h = (Math.imul(x, 0x9e3779b1) ^ Math.imul(y, 0x85ebca77) ^ Math.imul(z, 0xc2b2ae3d)) >>> 0;
  return h ^ (h >>> 15);
};

/**
 * The indexer's hot loop, a function of its own (a one-off run of a long loop is optimized while
 * it runs; code after it in the same function would be compiled before it ever ran): adds
 * corners from `at` to `indices` from place k, finding or making each one's vertex; found[0]
 * holds the vertex count. Stops after a new vertex fills the table to half (the caller grows it
 * and goes on); returns the corners added.
 */
function addCorners(
  f: Float32Array, bits: Int32Array, at: number, count: number, indices: Uint32Array, k: number,
  vertices: Float32Array, vbits: Int32Array, recent: Int32Array, table: Int32Array, found: Int32Array,
): number {
  const mask = table.length - 1;
  let nv = found[0]!, c = 0;
  for (let b = at; c < count; b += 3) {
    const x = bits[b]!, y = bits[b + 1]!, z = bits[b + 2]!;
    const hx = hash3(x, y, z);
    c++;
    // the recent vertices first (a file's neighbouring triangles share corners)
    const slot = hx & RECENT_MASK, r = recent[slot]!;
    if (r !== 0) {
      const o = (r - 1) * 3;
      if (vbits[o] === x && vbits[o + 1] === y && vbits[o + 2] === z) { indices[k++] = r - 1; continue; }
    }
    let h = hx & mask;
    let v = -1;
    for (;;) {
      const e = table[h]!;
      if (e === 0) break;
      const o = (e - 1) * 3;
      if (vbits[o] === x && vbits[o + 1] === y && vbits[o + 2] === z) { v = e - 1; break; }
      h = (h + 1) & mask;
    }
    recent[slot] = (v < 0 ? nv : v) + 1;
    if (v >= 0) { indices[k++] = v; continue; }
    v = nv++;
    const o = v * 3;
    vertices[o] = f[b]!; vertices[o + 1] = f[b + 1]!; vertices[o + 2] = f[b + 2]!;
    table[h] = nv;
    indices[k++] = v;
    // stored as it grows, not after the loop: the optimized loop leaves with nothing left to learn
    found[0] = nv;
    if (nv * 2 > table.length) break;
  }
  return c;
}

/**
 * Builds an indexed mesh from corners given in order, a chunk at a time (the streaming STL
 * reader feeds it 20,000 facets at once; `indexSoup` the whole soup). An open-addressing table
 * keyed on the coordinates' bits finds a corner's vertex; the table is sized to the vertices
 * (about half the triangles for a closed mesh) and doubles at half full. The vertex array is
 * reserved for the worst case (a vertex per corner) but only the pages written are ever
 * mapped, so memory is the vertices actually found.
 */
export class VertexIndexer {
  readonly indices: Uint32Array;
  private readonly vertices: Float32Array;
  private readonly vbits: Int32Array;
  private table: Int32Array;
  private readonly arena: WorkArena;
  /** found[0]: the vertices found so far (the hot loop's count, kept across calls). */
  private readonly found = new Int32Array(1);
  /** A small direct-mapped table of vertices met lately (it stays in the processor's cache), tried before `table`. */
  private readonly recent = new Int32Array(RECENT_MASK + 1);
  private corners = 0;
  vertexCount = 0;

  /**
   * `shared`: the indices and vertices in shared memory (SharedArrayBuffer), so another thread
   * can read the finished mesh without a copy (./slice-ahead).
   */
  constructor(readonly triangleCount: number, opts: { shared?: boolean } = {}) {
    const Memory = opts.shared ? SharedArrayBuffer : ArrayBuffer;
    this.indices = new Uint32Array(new Memory(triangleCount * 12));
    this.vertices = new Float32Array(new Memory(triangleCount * 36));
    this.vbits = new Int32Array(this.vertices.buffer);
    // the lookup table in the block of memory that weld, topology and slicing use next (sized
    // for a closed mesh's topology; pages never written are never mapped), so the mesh's peak
    // memory holds one of them, not both
    this.arena = new WorkArena(arenaWords(triangleCount, triangleCount >> 1));
    [this.table] = this.arena.int32(pow2AtLeast(triangleCount)) as [Int32Array];
  }

  /** Adds `count` corners: 3 float32 each in `f` from index `at` (`bits` views the same memory as Int32). */
  add(f: Float32Array, bits: Int32Array, at: number, count: number): void {
    if (this.corners + count > this.indices.length) throw new RangeError("more corners than the mesh's triangles");
    const found = this.found;
    found[0] = this.vertexCount;
    for (let done = 0; done < count;) {
      const c = addCorners(f, bits, at + done * 3, count - done, this.indices, this.corners, this.vertices, this.vbits, this.recent, this.table, found);
      this.corners += c;
      done += c;
      // the table doubles at half full
      if (found[0]! * 2 > this.table.length) this.grow(found[0]!);
    }
    this.vertexCount = found[0]!;
  }

  private grow(nv: number): void {
    const table = new Int32Array(this.table.length * 2);
    const mask = table.length - 1, vbits = this.vbits;
    for (let v = 0; v < nv; v++) {
      const o = v * 3;
      let h = hash3(vbits[o]!, vbits[o + 1]!, vbits[o + 2]!) & mask;
      while (table[h] !== 0) h = (h + 1) & mask;
      table[h] = v + 1;
    }
    this.table = table;
  }

  /** The mesh, once every triangle's corners were added; the lookup table is let go. */
  finish(): IndexedMesh {
    if (this.corners !== this.indices.length) throw new RangeError(`${this.corners / 3} of ${this.triangleCount} triangles were added`);
    this.table = new Int32Array(0);
    const mesh = { vertices: this.vertices.subarray(0, this.vertexCount * 3), indices: this.indices, vertexCount: this.vertexCount, triangleCount: this.triangleCount };
    // the table's block becomes the mesh's work arena when it is large enough (a closed mesh's is)
    if (this.arena.words >= arenaWords(mesh.triangleCount, mesh.vertexCount)) adoptArena(mesh, this.arena);
    return mesh;
  }
}

/** The indexed form of a triangle soup (same triangles, same winding, same bits). */
export function indexSoup(mesh: Mesh): IndexedMesh {
  const p = mesh.positions;
  const ix = new VertexIndexer(mesh.triangleCount);
  ix.add(p, new Int32Array(p.buffer, p.byteOffset, mesh.triangleCount * 9), 0, mesh.triangleCount * 3);
  return ix.finish();
}

export function toIndexed(mesh: Mesh | IndexedMesh): IndexedMesh {
  return isIndexed(mesh) ? mesh : indexSoup(mesh);
}

/** The triangle soup again, 9 float32 a triangle (tests, and callers that want the soup). */
export function toSoup(m: IndexedMesh): Mesh {
  const positions = new Float32Array(m.triangleCount * 9);
  const { vertices, indices } = m;
  for (let i = 0; i < indices.length; i++) {
    const o = indices[i]! * 3, d = i * 3;
    positions[d] = vertices[o]!; positions[d + 1] = vertices[o + 1]!; positions[d + 2] = vertices[o + 2]!;
  }
  return { positions, triangleCount: m.triangleCount };
}

/**
 * Scales the vertices in place (inches to millimetres) and keeps the mesh what `indexSoup`
 * would give for the scaled soup: float32 rounding can take two distinct coordinates to the
 * same bits, and those vertices are merged into the earlier one (renumbered in order of first
 * appearance, as ever).
 */
export function scaleIndexed(m: IndexedMesh, s: number): IndexedMesh {
  if (s === 1) return m;
  const p = m.vertices, nv = m.vertexCount;
  for (let i = 0; i < nv * 3; i++) p[i] = p[i]! * s;
  const bits = new Int32Array(p.buffer, p.byteOffset, nv * 3);
  const table = new Int32Array(pow2AtLeast(nv * 2));
  const mask = table.length - 1;
  const to = new Uint32Array(nv);
  let kept = 0;
  for (let v = 0; v < nv; v++) {
    const o = v * 3, x = bits[o]!, y = bits[o + 1]!, z = bits[o + 2]!;
    let h = hash3(x, y, z) & mask;
    let same = -1;
    for (;;) {
      const e = table[h]!;
      if (e === 0) break;
      const q = (e - 1) * 3;
      if (bits[q] === x && bits[q + 1] === y && bits[q + 2] === z) { same = e - 1; break; }
      h = (h + 1) & mask;
    }
    if (same >= 0) { to[v] = same; continue; }
    // kept vertices move down to their new number (never over one not yet read: kept ≤ v);
    // the table holds new numbers, whose slots are final
    if (kept !== v) { const d = kept * 3; p[d] = p[o]!; p[d + 1] = p[o + 1]!; p[d + 2] = p[o + 2]!; }
    table[h] = kept + 1;
    to[v] = kept++;
  }
  if (kept === nv) return m;
  const indices = m.indices;
  for (let i = 0; i < indices.length; i++) indices[i] = to[indices[i]!]!;
  return { vertices: p.subarray(0, kept * 3), indices, vertexCount: kept, triangleCount: m.triangleCount };
}
