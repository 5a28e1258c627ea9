"use client";

import { CartesianGrid, ComposedChart, Legend, Line, ReferenceArea, ResponsiveContainer, Scatter, Tooltip, XAxis, YAxis } from "recharts";
import { mmToIn, type UnitsPref } from "@/lib/units";

export interface LayerChartProps {
  layerChart: { zMm: number[]; timeS: number[]; dwellS: number[]; flagged: boolean[]; stride: number };
  minLayerTimeS: number;
  maxLayerTimeS: number;
  units: UnitsPref;
}

/** A small marker, so hundreds of flagged layers stay readable. */
function FlagDot(props: unknown) {
  const { cx, cy } = props as { cx?: number; cy?: number };
  if (cx === undefined || cy === undefined) return <g />;
  return <circle cx={cx} cy={cy} r={2} fill="#b42318" />;
}

/** Layer time across the build height, with the material's cooling window shaded. */
export function LayerChart({ layerChart, minLayerTimeS, maxLayerTimeS, units }: LayerChartProps) {
  const toH = (mm: number) => (units === "in" ? Math.round(mmToIn(mm) * 100) / 100 : Math.round(mm));
  const data = layerChart.zMm.map((z, i) => ({
    z: toH(z),
    time: Math.round(layerChart.timeS[i] ?? 0),
    total: Math.round((layerChart.timeS[i] ?? 0) + (layerChart.dwellS[i] ?? 0)),
    flagged: layerChart.flagged[i] ? Math.round((layerChart.timeS[i] ?? 0) + (layerChart.dwellS[i] ?? 0)) : null,
  }));
  if (data.length === 0) return <p className="text-sm text-ink-500">No layers to chart.</p>;
  const yMax = Math.max(maxLayerTimeS * 1.15, ...data.map((d) => d.total));
  return (
    <figure aria-label="Layer times across the build height" className="space-y-1">
      <div className="h-64 w-full">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart data={data} margin={{ top: 8, right: 12, bottom: 20, left: 0 }}>
            <CartesianGrid stroke="#e8e3d7" strokeDasharray="3 3" />
            <ReferenceArea y1={minLayerTimeS} y2={maxLayerTimeS} fill="#2c8a83" fillOpacity={0.12} stroke="#2c8a83" strokeOpacity={0.4} ifOverflow="extendDomain" label={{ value: "Cooling window", position: "insideTopRight", fill: "#1b5853", fontSize: 11 }} />
            <XAxis dataKey="z" type="number" domain={["dataMin", "dataMax"]} tick={{ fontSize: 11 }} label={{ value: `Build height (${units})`, position: "insideBottom", offset: -12, fontSize: 11 }} />
            <YAxis domain={[0, Math.ceil(yMax)]} tick={{ fontSize: 11 }} width={48} label={{ value: "s per layer", angle: -90, position: "insideLeft", fontSize: 11 }} />
            <Tooltip formatter={(v, name) => [`${v} s`, name]} labelFormatter={(z) => `Height ${z} ${units}`} />
            <Legend verticalAlign="top" height={24} wrapperStyle={{ fontSize: 11 }} />
            <Line type="stepAfter" dataKey="time" name="Path time" stroke="#6b7480" dot={false} strokeWidth={1.2} isAnimationActive={false} />
            <Line type="stepAfter" dataKey="total" name="With dwell" stroke="#d9692a" dot={false} strokeWidth={1.6} isAnimationActive={false} />
            <Scatter dataKey="flagged" name="Flagged layer" fill="#b42318" isAnimationActive={false} shape={FlagDot} />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="text-xs text-ink-500">
        Each layer must be laid {minLayerTimeS}–{maxLayerTimeS} s after the one below (the material&rsquo;s cooling window). Short layers get a
        dwell; layers still outside the window are flagged.{layerChart.stride > 1 ? ` Every ${layerChart.stride} layers are averaged into one point.` : ""}
      </figcaption>
    </figure>
  );
}
