import { closeSync, fstatSync, openSync, readFileSync, readSync } from "node:fs";
import { EstimateInputError } from "./errors";
import { VertexIndexer, type IndexedMesh } from "./indexed";
import { extension, readModel, withUnits, type ReadModelResult } from "./read-model";
import { binaryStlCount, decodeFacets, decodeFacetsAligned, STL_FACET_BYTES, STL_HEAD_BYTES } from "./readers/stl";
import type { LengthUnit, Mesh } from "./types";

/** Facets read per chunk: 4,096 × 50 bytes ≈ 200 kB of buffer, reused (a larger one reads no faster from the page cache and holds more memory). */
const CHUNK_FACETS = 4096;
const LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

/**
 * Reads a model file from disk into millimetres. A binary STL (the file is exactly 84 + 50·n
 * bytes long) streams in 200 kB chunks, each decoded and added to an indexed mesh (./indexed:
 * its distinct corners and three indices a triangle), so neither the file's bytes nor the
 * triangle soup is ever held whole: memory is about 18 bytes a triangle instead of 36. The mesh
 * lives in shared memory, so a helper thread can slice it while this one measures
 * (./slice-ahead). Other files are read whole and passed to `readModel` (a soup).
 */
export async function readModelFile(
  path: string,
  fileName: string,
  opts: { units?: LengthUnit; toleranceMm?: number; bodies?: number[] } = {},
): Promise<ReadModelResult<Mesh | IndexedMesh>> {
  let fd: number;
  try { fd = openSync(path, "r"); } catch { throw new EstimateInputError("file:unreadable", `Cannot read the file "${fileName}".`); }
  try {
    const size = fstatSync(fd).size;
    const ext = extension(fileName);
    if ((ext === "stl" || ext === "") && size >= STL_HEAD_BYTES) {
      const head = new Uint8Array(STL_HEAD_BYTES);
      readFully(fd, head, 0);
      const n = new DataView(head.buffer).getUint32(STL_HEAD_BYTES - 4, true);
      if (STL_HEAD_BYTES + n * STL_FACET_BYTES === size) return withUnits(streamBinaryStl(fd, head, size), "stl-binary", opts.units);
    }
    if (size === 0) throw new EstimateInputError("file:empty", "The file is empty.");
    // readFileSync's Buffer is a Uint8Array: passed as it is, not copied
    return await readModel(readFileSync(fd), fileName, opts);
  } finally {
    closeSync(fd);
  }
}

function streamBinaryStl(fd: number, head: Uint8Array, size: number): IndexedMesh {
  const n = binaryStlCount(head, size);
  const indexer = new VertexIndexer(n, { shared: true });
  // the chunk and, for facets at an odd place (50 bytes is not a multiple of 4), the chunk again two bytes on
  const chunk = new Uint8Array(CHUNK_FACETS * STL_FACET_BYTES + 4);
  const shifted = new Uint8Array(chunk.length);
  const corners = new Float32Array(CHUNK_FACETS * 9);
  const cornerBits = new Int32Array(corners.buffer);
  const view = new DataView(chunk.buffer);
  let done = 0;
  while (done < n) {
    const count = Math.min(CHUNK_FACETS, n - done);
    const bytes = count * STL_FACET_BYTES;
    readFully(fd, chunk.subarray(0, bytes), STL_HEAD_BYTES + done * STL_FACET_BYTES);
    if (LITTLE_ENDIAN) {
      shifted.set(chunk.subarray(2, bytes));
      decodeFacetsAligned(chunk, shifted, count, corners);
    } else {
      decodeFacets(view, 0, count, corners, 0);
    }
    indexer.add(corners, cornerBits, 0, count * 3);
    done += count;
  }
  return indexer.finish();
}

function readFully(fd: number, into: Uint8Array, position: number): void {
  let got = 0;
  while (got < into.length) {
    const r = readSync(fd, into, got, into.length - got, position + got);
    if (r === 0) throw new EstimateInputError("stl:truncated", "The STL file ended before its last facet.");
    got += r;
  }
}
