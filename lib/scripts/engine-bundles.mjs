import { existsSync, mkdirSync, readFileSync, renameSync, statSync, writeFileSync } from "node:fs";
import path from "node:path";

/**
 * The engine's two standalone bundles, built by esbuild into .worker/: the estimate pool's worker
 * (lib/estimating/worker-entry.ts) and the estimate command line (lib/estimating/cli.ts). Each
 * bundle keeps a list of the source files it was built from (esbuild's metafile), so a launcher
 * can tell in a millisecond whether a source changed since, and bundle again only then.
 * Plain JavaScript: it runs before anything can compile TypeScript.
 */
export const root = path.resolve(import.meta.dirname, "../..");
const out = path.join(root, ".worker");

export const bundles = {
  worker: { entry: "lib/estimating/worker-entry.ts", outfile: path.join(out, "estimate-worker.mjs") },
  cli: { entry: "lib/estimating/cli.ts", outfile: path.join(out, "estimate-cli.mjs"), with: ["slicer"] },
  // the command line's slicing helper thread, loaded from beside its bundle
  slicer: { entry: "lib/estimating/slice-worker.ts", outfile: path.join(out, "slice-worker.mjs") },
};

const inputsOf = (outfile) => outfile.replace(/\.mjs$/, ".inputs.json");

/** True when the bundle is missing or a file it was built from (or the bundler's own options) changed since. */
export function isStale(name) {
  const { outfile } = bundles[name];
  const list = inputsOf(outfile);
  if (!existsSync(outfile) || !existsSync(list)) return true;
  let built;
  try {
    built = statSync(outfile).mtimeMs;
    const inputs = JSON.parse(readFileSync(list, "utf8"));
    for (const file of [...inputs, "lib/scripts/engine-bundles.mjs"]) {
      const s = statSync(path.join(root, file), { throwIfNoEntry: false });
      if (!s || s.mtimeMs > built) return true;
    }
  } catch {
    return true;
  }
  return false;
}

/** Bundles one entry into a standalone ES module for Node 20 and records its inputs. */
export async function buildBundle(name) {
  const { build } = await import("esbuild");
  const { entry, outfile } = bundles[name];
  const result = await build({
    entryPoints: [path.join(root, entry)],
    outfile,
    bundle: true,
    platform: "node",
    format: "esm",
    target: "node20",
    metafile: true,
    // the CAD kernel reader loads its own files at run time and libSQL its native binary: keep them package imports
    external: ["occt-import-js", "@libsql/client"],
    banner: { js: "import { createRequire as __cr } from 'node:module'; const require = __cr(import.meta.url);" },
    logLevel: "warning",
    write: false,
  });
  // written aside and renamed into place: a process starting the old bundle meanwhile reads a whole file
  mkdirSync(path.dirname(outfile), { recursive: true });
  const code = result.outputFiles.find((f) => f.path === outfile) ?? result.outputFiles[0];
  const aside = `${outfile}.${process.pid}.tmp`;
  writeFileSync(aside, code.contents);
  renameSync(aside, outfile);
  const inputs = Object.keys(result.metafile.inputs).filter((f) => !f.startsWith("node_modules/"));
  writeFileSync(inputsOf(outfile), JSON.stringify(inputs));
  return outfile;
}

/** The bundle's path, bundling first when it (or a bundle it loads) is missing or stale. */
export async function ensureBundle(name) {
  for (const other of bundles[name].with ?? []) await ensureBundle(other);
  if (isStale(name)) await buildBundle(name);
  return bundles[name].outfile;
}
