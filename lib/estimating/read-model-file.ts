import { closeSync, fstatSync, openSync, readFileSync, readSync } from "node:fs";
import { EstimateInputError } from "./errors";
import { extension, readModel, withUnits, type ReadModelResult } from "./read-model";
import { binaryStlCount, decodeFacets, STL_FACET_BYTES, STL_HEAD_BYTES } from "./readers/stl";
import type { LengthUnit } from "./types";

/** Facets read per chunk: 20,000 × 50 bytes ≈ 1 MB of buffer, reused. */
const CHUNK_FACETS = 20_000;

/**
 * Reads a model file from disk into a triangle soup in millimetres. A binary STL (the file is
 * exactly 84 + 50·n bytes long) streams in 1 MB chunks straight into its Float32Array, so the
 * file's bytes are never held whole: memory is the 36 bytes a triangle of the soup. Other files
 * are read whole and passed to `readModel`.
 */
export async function readModelFile(
  path: string,
  fileName: string,
  opts: { units?: LengthUnit; toleranceMm?: number; bodies?: number[] } = {},
): Promise<ReadModelResult> {
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

function streamBinaryStl(fd: number, head: Uint8Array, size: number) {
  const n = binaryStlCount(head, size);
  const positions = new Float32Array(n * 9);
  const chunk = new Uint8Array(CHUNK_FACETS * STL_FACET_BYTES);
  const view = new DataView(chunk.buffer);
  let done = 0;
  while (done < n) {
    const count = Math.min(CHUNK_FACETS, n - done);
    readFully(fd, chunk.subarray(0, count * STL_FACET_BYTES), STL_HEAD_BYTES + done * STL_FACET_BYTES);
    decodeFacets(view, 0, count, positions, done * 9);
    done += count;
  }
  return { positions, triangleCount: n };
}

function readFully(fd: number, into: Uint8Array, position: number): void {
  let got = 0;
  while (got < into.length) {
    const r = readSync(fd, into, got, into.length - got, position + got);
    if (r === 0) throw new EstimateInputError("stl:truncated", "The STL file ended before its last facet.");
    got += r;
  }
}
