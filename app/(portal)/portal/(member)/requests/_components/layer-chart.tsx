"use client";

import { CartesianGrid, ComposedChart, Legend, Line, ReferenceArea, ResponsiveContainer, Scatter, Tooltip, XAxis, YAxis } from "recharts";
import { mmToIn, type UnitsPref } from "@/lib/units";

export interface LayerChartProps {
  layerChart: { zMm: number[]; timeS: number[]; dwellS: number[]; flagged: boolean[]; stride: number };
  minLayerTimeS: number;
  maxLayerTimeS: number;
  units: UnitsPref;
}

export interface LayerPoint {
  /** Height above the build plate, in the user's unit (mm or in). */
  height: number;
  /** Path time of the layer, s. */
  time: number;
  /** Path time plus dwell, s. */
  total: number;
  isFlagged: boolean;
}

/**
 * The chart's points: heights measured from the bottom of the printed (grown) shape, so the axis
 * starts at 0 whatever offset the slicer's coordinates carry; times rounded to whole seconds.
 */
export function layerPoints(chart: LayerChartProps["layerChart"], units: UnitsPref): LayerPoint[] {
  const base = chart.zMm.length ? Math.min(...chart.zMm) : 0;
  const toH = (mm: number) => (units === "in" ? Math.round(mmToIn(mm - base) * 100) / 100 : Math.round(mm - base));
  return chart.zMm.map((z, i) => ({
    height: toH(z),
    time: Math.round(chart.timeS[i] ?? 0),
    total: Math.round((chart.timeS[i] ?? 0) + (chart.dwellS[i] ?? 0)),
    isFlagged: Boolean(chart.flagged[i]),
  }));
}

/** A small marker, so hundreds of flagged layers stay readable. */
function FlagDot(props: unknown) {
  const { cx, cy } = props as { cx?: number; cy?: number };
  if (cx === undefined || cy === undefined) return <g />;
  return <circle cx={cx} cy={cy} r={2.5} fill="#b42318" />;
}

/** One tooltip: the height in its length unit, each time in seconds. */
function LayerTooltip({ active, payload, units }: { active?: boolean; payload?: { payload?: LayerPoint }[]; units: UnitsPref }) {
  const p = active ? payload?.[0]?.payload : undefined;
  if (!p) return null;
  return (
    <div className="rounded bg-white px-2 py-1 text-xs shadow ring-1 ring-paper-200">
      <p className="font-medium text-ink-800">Height {p.height} {units}</p>
      <p className="text-ink-600">Path time {p.time} s</p>
      <p className="text-ink-600">With dwell {p.total} s</p>
      {p.isFlagged ? <p className="font-medium text-signal-danger">Outside the cooling window</p> : null}
    </div>
  );
}

/** Layer time (s) across the build height (mm or in), with the material's cooling window as a band. */
export function LayerChart({ layerChart, minLayerTimeS, maxLayerTimeS, units }: LayerChartProps) {
  const data = layerPoints(layerChart, units);
  if (data.length === 0) return <p className="text-sm text-ink-500">No layers to chart.</p>;
  // Only flagged layers get a marker; with none, no marker series is drawn at all.
  const flagged = data.filter((d) => d.isFlagged);
  const yMax = Math.max(maxLayerTimeS * 1.15, ...data.map((d) => d.total));
  const xMax = data.at(-1)!.height;
  return (
    <figure aria-label="Layer times across the build height" className="space-y-1">
      <div className="h-64 w-full">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart data={data} margin={{ top: 8, right: 12, bottom: 20, left: 4 }}>
            <CartesianGrid stroke="#e8e3d7" strokeDasharray="3 3" />
            <ReferenceArea y1={minLayerTimeS} y2={maxLayerTimeS} fill="#2c8a83" fillOpacity={0.14} stroke="#2c8a83" strokeOpacity={0.4} ifOverflow="extendDomain" label={{ value: `Cooling window ${minLayerTimeS}–${maxLayerTimeS} s`, position: "insideTopRight", fill: "#1b5853", fontSize: 11 }} />
            <XAxis dataKey="height" type="number" domain={[0, xMax]} tick={{ fontSize: 11 }} label={{ value: `Build height (${units})`, position: "insideBottom", offset: -12, fontSize: 11 }} />
            <YAxis type="number" domain={[0, Math.ceil(yMax)]} tick={{ fontSize: 11 }} width={52} label={{ value: "Layer time (s)", angle: -90, position: "insideLeft", fontSize: 11, style: { textAnchor: "middle" } }} />
            <Tooltip content={<LayerTooltip units={units} />} />
            <Legend verticalAlign="top" height={24} wrapperStyle={{ fontSize: 11 }} />
            <Line type="stepAfter" dataKey="time" name="Path time" stroke="#6b7480" dot={false} strokeWidth={1.2} isAnimationActive={false} />
            <Line type="stepAfter" dataKey="total" name="With dwell" stroke="#d9692a" dot={false} strokeWidth={1.6} isAnimationActive={false} />
            {flagged.length ? <Scatter data={flagged} dataKey="total" name="Flagged layer" fill="#b42318" isAnimationActive={false} shape={FlagDot} /> : null}
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="text-xs text-ink-500">
        Each layer must be laid {minLayerTimeS}–{maxLayerTimeS} s after the one below (the material&rsquo;s cooling window, the shaded band). Short layers get a
        dwell{flagged.length ? `; ${flagged.length} ${flagged.length === 1 ? "point is" : "points are"} still outside the window and flagged (red)` : "; no layer falls outside the window"}.
        {layerChart.stride > 1 ? ` Every ${layerChart.stride} layers are averaged into one point.` : ""}
      </figcaption>
    </figure>
  );
}
