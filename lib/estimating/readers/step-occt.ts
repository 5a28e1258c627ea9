import { createRequire } from "node:module";

/**
 * Loading of the OpenCascade kernel (npm `occt-import-js`, a WebAssembly build, LGPL-2.1).
 * The module is compiled once per process (per worker thread) and the promise cached: its
 * load costs about 0.1 s and some 30 MB of WASM heap, so paying it per file would dominate small
 * files. The kernel prints its diagnostics through emscripten's `print`/`printErr`; they are
 * routed to a sink that the current call swaps in, so a parse error can be named to the user.
 * Calls into the kernel are synchronous, so one sink at a time is enough.
 */

/** The part of the library's result the reader uses (see the package README). */
export interface OcctMesh {
  name?: string;
  attributes: { position: { array: ArrayLike<number> } };
  index: { array: ArrayLike<number> };
}
export interface OcctNode {
  name: string;
  meshes: number[];
  children: OcctNode[];
}
export interface OcctResult {
  success: boolean;
  root?: OcctNode;
  meshes?: OcctMesh[];
}
export interface OcctParams {
  linearUnit?: "millimeter" | "centimeter" | "meter" | "inch" | "foot";
  linearDeflectionType?: "bounding_box_ratio" | "absolute_value";
  linearDeflection?: number;
  angularDeflection?: number;
}
export interface OcctModule {
  ReadStepFile(content: Uint8Array, params: OcctParams | null): OcctResult;
  ReadIgesFile(content: Uint8Array, params: OcctParams | null): OcctResult;
  HEAPU8: Uint8Array;
}

type Factory = (overrides?: Record<string, unknown>) => Promise<OcctModule>;

let cached: Promise<OcctModule> | null = null;
let loaded: OcctModule | null = null;
let loadMs: number | null = null;
let sink: ((line: string) => void) | null = null;

function route(line: string): void {
  if (sink) sink(String(line));
}

/** The kernel, loaded on first use and shared by every later call in this process. */
export function loadOcct(): Promise<OcctModule> {
  if (!cached) {
    const t0 = performance.now();
    const require = createRequire(import.meta.url);
    const factory = require("occt-import-js") as Factory;
    cached = factory({ print: route, printErr: route }).then(
      (m) => {
        loadMs = performance.now() - t0;
        loaded = m;
        return m;
      },
      (e: unknown) => {
        cached = null;
        throw e;
      },
    );
  }
  return cached;
}

/**
 * Forget the loaded kernel. Called after the kernel itself threw (out of WASM memory, an
 * abort): emscripten marks such a module dead, so the next file needs a fresh instance.
 */
export function dropOcct(): void {
  cached = null;
  loaded = null;
  loadMs = null;
}

/** Run one synchronous kernel call, collecting the lines it prints. */
export function withKernelLog<T>(fn: () => T): { value: T; log: string[] } {
  const log: string[] = [];
  sink = (line) => {
    if (log.length < 200) log.push(line);
  };
  try {
    return { value: fn(), log };
  } finally {
    sink = null;
  }
}

/** Milliseconds the first load took in this process, or null before it finished. */
export function occtLoadMs(): number | null {
  return loadMs;
}

/**
 * Bytes of WASM linear memory the kernel holds now. It only grows (emscripten never gives
 * memory back), up to the build's own ceiling of 2 GiB, so a worker whose heap has grown far
 * should be retired after its file.
 */
export function occtHeapBytes(m: OcctModule): number {
  return m.HEAPU8.buffer.byteLength;
}

/** WASM bytes held by the kernel if this process has loaded it, else null (loads nothing). */
export function loadedOcctHeapBytes(): number | null {
  return loaded ? occtHeapBytes(loaded) : null;
}
