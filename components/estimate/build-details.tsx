import type { EstimateResult, PieceEstimate } from "@/lib/estimating/types";
import { formatCents } from "@/lib/money";

const when = (iso: string, timeZone: string) =>
  new Date(iso).toLocaleString("en-GB", { weekday: "short", day: "numeric", month: "short", hour: "2-digit", minute: "2-digit", timeZone: timeZone || "UTC", timeZoneName: "short" });
const metres = (mm: number) => `${(mm / 1000).toLocaleString("en-US", { maximumFractionDigits: 2 })} m`;
const hours = (h: number) => `${h.toLocaleString("en-US", { maximumFractionDigits: 1 })} h`;
const kgH = (v: number) => `${v.toLocaleString("en-US", { maximumFractionDigits: 1 })} kg/h`;

/** The build in words: horizontal or vertical, shell or solid. */
export function buildModeText(mode: string | undefined): string {
  switch (mode) {
    case "vertical-shell": return "Built vertically, layers across its length: shell";
    case "vertical-solid": return "Built vertically, layers across its length: solid";
    case "solid": return "Built flat: solid";
    default: return "Built flat: shell";
  }
}

type Shown = Pick<EstimateResult, "printMode" | "drying" | "feed" | "pieces" | "joint" | "schedule" | "split" | "machining">;

/**
 * How the part is built beyond cell and fill: vertical printing of a long part, pellet drying
 * before the first layer and the feed it allows, machining set-ups, and a split part's pieces and
 * joint. Shown to the client (no piece prices: those are before margin) and to staff (with them). Estimates made before these
 * figures existed show none of it.
 */
export function BuildDetails({ r, priceWithheld, staff = false }: { r: Partial<Shown>; priceWithheld: boolean; staff?: boolean }) {
  const tz = r.schedule?.timeZone ?? "UTC";
  const pieces = r.pieces ?? [];
  const vertical = typeof r.printMode === "string" && r.printMode.startsWith("vertical-");
  return (
    <div className="space-y-2 text-sm" data-testid="build-details">
      {vertical && pieces.length === 0 ? (
        <p className="text-ink-800" data-testid="build-vertical">
          {buildModeText(r.printMode)}, on the cell&apos;s long axis, so the part prints whole without a joint.
        </p>
      ) : null}
      {r.drying && r.schedule?.dryingStart ? (
        <p className="text-ink-700" data-testid="build-drying">
          Pellets dried {hours(r.drying.hours)} at {r.drying.tempC} °C before the first layer (from {when(r.schedule.dryingStart, tz)})
          {r.feed?.limitedBy === "dryer"
            ? `; the ${r.drying.dryerKg.toLocaleString("en-US")} kg dryer keeps ${kgH(r.drying.maxKgPerH)} dry, so printing is held to that rate.`
            : staff && r.feed ? `; fed at up to ${kgH(r.feed.kgPerH)} (the extruder's limit; the dryer keeps ${kgH(r.drying.maxKgPerH)} dry).` : "."}
        </p>
      ) : null}
      {r.machining?.bedFaceFinished !== undefined ? (
        <p className="text-ink-700" data-testid="build-machining">
          {r.machining.bedFaceFinished ? "Machined on every face: turned over for a second set-up to finish the face it was printed on." : "Machined on every face but the one it was printed on, which is left as printed (ask if it must be finished)."}
          {r.machining.trimLengthMm ? ` Trim line cut along the edge (${metres(r.machining.trimLengthMm)}).` : ""}
        </p>
      ) : null}
      {pieces.length ? (
        <div data-testid="build-pieces">
          <p className="text-ink-800">
            Too long for any cell in one piece: made as {pieces.length} pieces along its length, each printed and machined on its own, then bonded
            and machined across {r.joint && r.joint.cuts > 1 ? `the ${r.joint.cuts} joints` : "the joint"}.
          </p>
          <div tabIndex={0} className="focus-visible:outline-2 focus-visible:outline-ink-600 mt-1 overflow-x-auto">
            <table className="w-full min-w-[28rem] text-left text-sm">
              <caption className="sr-only">Pieces</caption>
              <thead className="text-xs text-ink-500">
                <tr>
                  <th className="py-1 pr-3 font-medium">Piece</th>
                  <th className="py-1 pr-3 font-medium">Cell and build</th>
                  <th className="py-1 pr-3 text-right font-medium">Printing</th>
                  <th className="py-1 pr-3 text-right font-medium">Machining</th>
                  {!staff || priceWithheld ? null : <th className="py-1 text-right font-medium">Before margin</th>}
                </tr>
              </thead>
              <tbody className="divide-y divide-paper-200">
                {pieces.map((p: PieceEstimate) => (
                  <tr key={p.index}>
                    <td className="figures py-1 pr-3">{p.index + 1}: {metres(p.fromMm)}–{metres(p.toMm)}</td>
                    <td className="py-1 pr-3">{p.cellName}, {buildModeText(p.printMode).replace("Built ", "").toLowerCase()}</td>
                    <td className="figures py-1 pr-3 text-right">{hours(p.printHours + p.dwellHours)}</td>
                    <td className="figures py-1 pr-3 text-right">{hours(p.machiningHours)}</td>
                    {!staff || priceWithheld ? null : <td className="figures py-1 text-right">{formatCents(p.subtotalCents)}</td>}
                  </tr>
                ))}
                {r.joint ? (
                  <tr>
                    <td className="py-1 pr-3">Joining</td>
                    <td className="py-1 pr-3">bonded, machined across</td>
                    <td className="py-1 pr-3" />
                    <td className="figures py-1 pr-3 text-right">{hours(r.joint.hours)}</td>
                    {!staff || priceWithheld ? null : <td className="py-1" />}
                  </tr>
                ) : null}
              </tbody>
            </table>
          </div>
        </div>
      ) : null}
    </div>
  );
}
