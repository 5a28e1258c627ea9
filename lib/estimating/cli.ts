import { existsSync } from "node:fs";
import { basename } from "node:path";
import { parseArgs } from "node:util";
import { analyse } from "./analyse";
import { defaultCells, defaultMaterials, defaultRateCard } from "./defaults";
import { EstimateInputError, isEstimateInputError } from "./errors";
import { readModelFile } from "./read-model-file";
import { helperMayPay, sliceThread } from "./slice-ahead";
import type { CapacityQueue } from "./ledger";
import { forCells, parseQueueArgs, queueFromRows, unscheduledOf, type BookedRow, type UnscheduledRow } from "./queue";
import type { CellParams, EstimateResult, MaterialParams, RateCardParams } from "./types";

/**
 * npm run estimate -- FILE [--units mm|in] [--material KEY] [--allowance MM] [--cell KEY]
 *   [--shell-walls N] [--solid] [--orientation x|y|z] [--quantity N] [--cure-temp C] [--finish-bed-face] [--trim-lines] [--tolerance MM] [--bodies 0,2,…]
 *   [--queue CELL=HOURS …] [--json]
 *   (--tolerance and --bodies apply to STEP/IGES files)
 * The work already booked comes from the database's calendar (jobs, maintenance blocks, accepted
 * orders not yet scheduled); with no database, an empty queue. `--queue` (repeatable; `router`
 * for the router) replaces it with booked hours, no slack, for what-if runs.
 * Exit 0 on success, 2 on a bad file or option (one plain line on stderr), 1 on anything else.
 */
const USAGE = "usage: npm run estimate -- FILE [--units mm|in] [--material KEY] [--allowance MM] [--cell KEY] [--shell-walls N] [--solid] [--orientation x|y|z] [--quantity N] [--cure-temp C] [--finish-bed-face] [--trim-lines] [--tolerance MM] [--bodies 0,2,…] [--queue CELL=HOURS …] [--json]";

interface Catalogue { materials: MaterialParams[]; cells: CellParams[]; rateCard: RateCardParams; source: string; queue: CapacityQueue }

const OFF_THE_CELL = "('shipped','delivered','closed','cancelled')";
/** The calendar's booked blocks and maintenance blocks ending after now, and accepted work not yet on it. */
const BOOKED_SQL = `select b.cell_key, b.kind, b.starts_at, b.ends_at, r.reference, o.planned_ship, q.ship_date from schedule_blocks b
  join orders o on o.id = b.order_id join requests r on r.id = o.request_id join quotes q on q.id = o.quote_id
  where b.ends_at > ? and r.stage not in ${OFF_THE_CELL}`;
const BLOCKS_SQL = "select resource_key, starts_at, ends_at, reason from maintenance_blocks where ends_at > ?";
const UNSCHEDULED_SQL = `select a.result from orders o join requests r on r.id = o.request_id join parts p on p.request_id = r.id
  join analyses a on a.revision_id = p.current_revision_id and a.status = 'done'
  where r.stage in ('accepted','deposit_paid') and o.cell_key is null order by a.created_at desc`;

/** Catalogue from the database when it exists and has rows, else the seed's defaults. */
async function loadCatalogue(): Promise<Catalogue> {
  const fallback: Catalogue = { materials: defaultMaterials, cells: defaultCells, rateCard: defaultRateCard, source: "defaults", queue: {} };
  const url = process.env.DATABASE_URL ?? "file:./data/layerwright.db";
  if (url.startsWith("file:") && !existsSync(url.slice(5))) return fallback;
  try {
    const { createClient } = await import("@libsql/client");
    const db = createClient({ url, authToken: process.env.DATABASE_AUTH_TOKEN });
    try {
      const rows = async (sql: string) => (await db.execute(sql)).rows.map((r) => JSON.parse(String(r.params)) as unknown);
      const materials = (await rows("select params from materials where is_current = 1 and is_active = 1")) as MaterialParams[];
      const cells = (await rows("select params from cells where is_current = 1 and is_active = 1")) as CellParams[];
      const cards = (await rows("select params from rate_cards where is_current = 1 order by version desc limit 1")) as Partial<RateCardParams>[];
      if (materials.length === 0 || cells.length === 0 || cards.length === 0) return fallback;
      return { materials, cells, rateCard: { ...defaultRateCard, ...cards[0] }, source: "database", queue: forCells(await loadQueue(db, Date.now()), cells.map((c) => c.key)) };
    } finally {
      db.close();
    }
  } catch {
    return fallback;
  }
}

type Exec = { execute: (q: string | { sql: string; args: (number | string)[] }) => Promise<{ rows: Record<string, unknown>[] }> };

/** The booked work from the database (a database from before maintenance blocks simply has none). */
async function loadQueue(db: Exec, nowMs: number): Promise<CapacityQueue> {
  const n = (v: unknown) => (v == null ? null : Number(v));
  const booked: BookedRow[] = (await db.execute({ sql: BOOKED_SQL, args: [nowMs] })).rows.map((r) => ({
    cellKey: String(r.cell_key), kind: String(r.kind) as BookedRow["kind"], startsAt: Number(r.starts_at), endsAt: Number(r.ends_at),
    ref: String(r.reference), plannedShipMs: n(r.planned_ship), promisedShipMs: n(r.ship_date),
  }));
  try {
    for (const r of (await db.execute({ sql: BLOCKS_SQL, args: [nowMs] })).rows) {
      booked.push({ cellKey: String(r.resource_key), kind: "maintenance", startsAt: Number(r.starts_at), endsAt: Number(r.ends_at), ref: String(r.reason) });
    }
  } catch { /* no maintenance table yet */ }
  const unscheduled: UnscheduledRow[] = (await db.execute(UNSCHEDULED_SQL)).rows.map((r) => unscheduledOf(JSON.parse(String(r.result)) as Partial<EstimateResult>)).filter((u): u is UnscheduledRow => u !== null);
  return queueFromRows(nowMs, booked, unscheduled);
}

function num(v: string | undefined, name: string): number | undefined {
  if (v === undefined) return undefined;
  const n = Number(v);
  if (!Number.isFinite(n)) throw new EstimateInputError("option:number", `--${name} needs a number, not "${v.slice(0, 20)}".`);
  return n;
}

function bodiesOf(v: string | undefined): number[] | undefined {
  return v === undefined ? undefined : v.split(",").map((b) => num(b.trim(), "bodies") ?? NaN);
}

const LEAD_LABEL = { standard: "standard", expedite: "expedited", economy: "economy" } as const;
const money = (c: number) => `$${(c / 100).toLocaleString("en-US", { minimumFractionDigits: 2, maximumFractionDigits: 2 })}`;
const f = (v: number, d = 1) => v.toLocaleString("en-US", { maximumFractionDigits: d });

function human(r: EstimateResult, source: string): string {
  const L: string[] = [];
  L.push(`ESTIMATE (automatic, not a sales-approved quote) — ${r.fileName}`);
  L.push(`  format ${r.format}, ${f(r.triangles, 0)} triangles, units ${r.units}${r.unitsGuessed ? " (guessed: confirm)" : ""}; catalogue from ${source}`);
  L.push(`  size ${r.bboxMm.map((v) => f(v)).join(" × ")} mm, volume ${f(r.volumeMm3 / 1e6, 3)} L, area ${f(r.areaMm2 / 1e6, 3)} m²`);
  L.push(`  ${r.watertight ? "watertight" : "NOT watertight"}: ${r.openEdges} open, ${r.nonManifoldEdges} non-manifold, ${r.inconsistentEdges} inconsistent edges; ${r.shells} shell(s)`);
  L.push(`  near-net at ${r.allowanceMm} mm allowance: ${f(r.nearNetVolumeMm3 / 1e6, 3)} L (${f(r.allowanceVolumeMm3 / 1e6, 3)} L to machine off)`);
  L.push("  fit:");
  for (const c of r.fits) L.push(`    ${c.cellName.padEnd(12)} ${c.fits ? "fits" : "does not fit"} (margin ${f(c.marginMm)} mm, build height ${f(c.buildHeightMm)} mm)`);
  if (r.split) L.push(`  split: ${r.split.pieces} pieces along ${r.split.axis} of ${f(r.split.pieceLengthMm)} mm for ${r.split.cell}`);
  for (const p of r.pieces ?? []) L.push(`    piece ${p.index + 1} (${f(p.fromMm)}–${f(p.toMm)} mm): ${p.cellName}, ${p.printMode}, ${p.layers} layers, ${f(p.printHours + p.dwellHours, 1)} h printing, ${f(p.machiningHours, 1)} h machining, ${money(p.subtotalCents)} before margin`);
  if (r.joint) L.push(`    joining: ${r.joint.cuts} joint(s), ${f(r.joint.faceAreaMm2 / 1e6, 3)} m² bonded, ${f(r.joint.hours, 2)} h`);
  L.push(`  status: ${r.status === "priced" ? "priced (a printable plan)" : "NEEDS REVIEW by the bureau's engineer (the total is an indicative figure for staff)"}`);
  for (const x of r.reviewReasons) L.push(`    review: ${x.message}`);
  const sh = r.shell;
  if (r.drying) L.push(`  drying: ${f(r.drying.hours, 1)} h at ${r.drying.tempC} °C in a ${f(r.drying.dryerKg, 0)} kg hopper from ${r.schedule.dryingStart}; it keeps ${f(r.drying.maxKgPerH, 1)} kg/h dry`);
  if (r.feed) L.push(`  feed ${f(r.feed.kgPerH, 1)} kg/h, set by the ${r.feed.limitedBy}${r.feed.screwMm ? ` (${r.feed.screwMm} mm screw, ${f(r.feed.extruderKgPerH, 0)} kg/h of this material)` : ""}`);
  L.push(`  print on ${r.cell} (${money(r.printRateCentsPerH)}/h), ${r.printMode}: ${r.layers} layers of ${r.layerHeightMm} mm, bead ${r.beadWidthMm} mm, ${sh ? `shell of ${sh.walls} walls (${f(sh.wallThicknessMm)} mm), ribs every ${f(sh.ribSpacingMm)} mm, ${sh.skinLayers}-layer skins, tops ${sh.bridging === "direct" ? "bridged directly" : "on support ribs"}` : "solid"}; ${f(r.meanSpeedMmS)} mm/s mean of ${f(r.speedMmS)} programmed`);
  if (r.batch.partsPerBuild > 1) L.push(`    ${r.batch.partsPerBuild} parts side by side per build, ${r.batch.builds} build(s)`);
  L.push(`    ${f(r.printHours, 2)} h printing, ${f(r.dwellHours, 2)} h dwell, ${r.flaggedLayers} layers over the cooling window, ${f(r.coolingHours, 1)} h cooling`);
  L.push(`  material ${r.material.name}: ${f(r.massKg, 1)} kg incl. purge and scrap; machined part ≈ ${f(r.partMassKg, 1)} kg (${f(r.partMassKg / 0.45359237, 1)} lb)`);
  L.push(`  machining ${f(r.machiningHours, 2)} h (roughing ${f(r.machining.roughingHours, 2)}, finishing ${f(r.machining.finishingHours, 2)} at ${f(r.machining.stepoverMm, 3)} mm stepover${r.machining.trimHours ? `, trim line ${f(r.machining.trimHours, 2)}` : ""}; ${r.machining.setups ?? 1} set-up(s), bed face ${r.machining.bedFaceFinished === false ? "left as printed" : "finished"})`);
  L.push("  price:");
  for (const l of r.lines) L.push(`    ${l.label.padEnd(48)} ${money(l.amountCents).padStart(14)}`);
  L.push(`    ${"Margin".padEnd(48)} ${money(r.marginCents).padStart(14)}`);
  L.push(`    ${"Tax".padEnd(48)} ${money(r.taxCents).padStart(14)}`);
  L.push(`    ${"Total".padEnd(48)} ${money(r.totalCents).padStart(14)}`);
  L.push(`    ${"Deposit".padEnd(48)} ${money(r.depositCents).padStart(14)}`);
  L.push(`  schedule (${r.schedule.timeZone}): set-up from ${r.schedule.setupStart}, printing straight through ${r.schedule.printStart} → ${r.schedule.printEnd}, machined by ${r.schedule.machiningEnd}`);
  L.push(`  earliest ship date ${r.shipDate} (${f(r.schedule.queueHours, 1)} working hours of booked work ahead on the cell); estimate valid until ${r.validUntil}`);
  for (const l of r.leadTimes) L.push(`    ${LEAD_LABEL[l.key].padEnd(10)} ships ${l.shipDate}  ${money(l.totalCents).padStart(14)}${l.adjustmentCents ? ` (${l.adjustmentCents > 0 ? "+" : "−"}${money(Math.abs(l.adjustmentCents))} before margin and tax)` : ""}${l.jumped ? `, ahead of ${l.jumped} booked job(s) that still make their dates` : ""}`);
  L.push(`  candidates planned: ${r.candidatesPlanned}; best of each cell:`);
  for (const a of r.alternatives) L.push(`    ${a.cellName.padEnd(12)} ${f(a.printHours + a.dwellHours, 1).padStart(7)} h ${money(a.totalCents).padStart(14)}  ships ${a.shipDate}  ${a.status === "priced" ? "" : "(review) "}${a.whyNot || "chosen"}`);
  for (const x of r.remedies) L.push(`  tried: ${x.tried} → ${x.result}`);
  for (const w of r.warnings) L.push(`  warning: ${w.message}`);
  for (const c of r.cautions) L.push(`  caution: ${c}`);
  return L.join("\n");
}

async function main(): Promise<number> {
  let parsed;
  try {
    parsed = parseArgs({
      allowPositionals: true,
      options: {
        units: { type: "string" }, material: { type: "string" }, allowance: { type: "string" }, cell: { type: "string" },
        "shell-walls": { type: "string" }, solid: { type: "boolean" }, orientation: { type: "string" }, quantity: { type: "string" }, "cure-temp": { type: "string" },
        tolerance: { type: "string" }, bodies: { type: "string" }, "finish-bed-face": { type: "boolean" }, "trim-lines": { type: "boolean" },
        queue: { type: "string", multiple: true }, json: { type: "boolean" }, help: { type: "boolean" },
      },
    });
  } catch (e) {
    process.stderr.write(`${(e as Error).message}\n${USAGE}\n`);
    return 2;
  }
  const { values: v, positionals } = parsed;
  if (v.help) { process.stdout.write(`${USAGE}\n`); return 0; }
  const file = positionals[0];
  let slicer: ReturnType<typeof slicingHelper>;
  try {
    if (!file || positionals.length > 1) throw new EstimateInputError("cli:usage", USAGE);
    if (v.solid && v["shell-walls"] !== undefined) throw new EstimateInputError("option:print-mode", "--solid and --shell-walls do not go together.");
    if (v.units !== undefined && v.units !== "mm" && v.units !== "in") throw new EstimateInputError("option:units", "--units must be mm or in.");
    if (v.orientation !== undefined && !["x", "y", "z"].includes(v.orientation)) throw new EstimateInputError("option:orientation", "--orientation must be x, y or z (the file axis that points up).");
    // the slicing helper thread starts now, so it is ready by the time the file is read
    slicer = slicingHelper();
    const cat = await loadCatalogue();
    let queue: Record<string, number> | undefined;
    try {
      if (v.queue?.length) queue = parseQueueArgs(v.queue, cat.cells.map((c) => c.key));
    } catch (e) {
      throw new EstimateInputError("option:queue", (e as Error).message);
    }
    // read from disk in chunks (a binary STL never sits whole in memory), then analysed in place
    const read = await readModelFile(file, basename(file), { units: v.units, toleranceMm: num(v.tolerance, "tolerance"), bodies: bodiesOf(v.bodies) });
    const r = await analyse({
      read, fileName: basename(file),
      options: {
        units: v.units, materialKey: v.material, allowanceMm: num(v.allowance, "allowance"), cellKey: v.cell,
        printMode: v.solid ? "solid" : "shell",
        shellWalls: num(v["shell-walls"], "shell-walls") ?? null, orientation: v.orientation as "x" | "y" | "z" | undefined,
        quantity: num(v.quantity, "quantity"), cureTempC: num(v["cure-temp"], "cure-temp"),
        toleranceMm: num(v.tolerance, "tolerance"),
        bodies: bodiesOf(v.bodies), finishBedFace: v["finish-bed-face"], trimLines: v["trim-lines"],
      },
      catalogue: cat, now: new Date(), sliceAhead: slicer,
      // --queue replaces the calendar's queue for a what-if run
      ...(queue ? { queue } : { queue: cat.queue.hours, booked: cat.queue.booked }),
    });
    process.stdout.write(v.json ? `${JSON.stringify(r)}\n` : `${human(r, cat.source)}\n`);
    return 0;
  } catch (e) {
    if (isEstimateInputError(e)) { process.stderr.write(`${e.message.split("\n")[0]}\n`); return 2; }
    process.stderr.write(`The estimator failed: ${(e as Error)?.message ?? String(e)}\n`);
    return 1;
  } finally {
    slicer?.close();
  }
}

/**
 * The slicing helper (./slice-ahead) on the bundle beside this one (.worker/slice-worker.mjs,
 * built with it by lib/scripts/engine-bundles.mjs); none when the command line runs from its
 * sources, which slices in line (the same figures). ESTIMATE_SLICE_THREAD=0: never; =1: even on
 * a busy machine; unset: started unless every core is taken by other work right now, given work
 * when a core was to spare while the file was read.
 */
function slicingHelper(): ReturnType<typeof sliceThread> | undefined {
  const mode = process.env.ESTIMATE_SLICE_THREAD;
  if (mode === "0" || (mode !== "1" && !helperMayPay())) return undefined;
  const file = new URL("./slice-worker.mjs", import.meta.url);
  return existsSync(file) ? sliceThread(file, { always: mode === "1" }) : undefined;
}

void main().then((code) => { process.exitCode = code; });
