"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { FormMessage, Input, Select } from "@/components/ui/input";
import type { FreightRules } from "@/lib/estimating/freight";
import { parseMoneyToCents } from "@/lib/quoting/lines";
import { saveFreightZones } from "../actions";

interface ZoneRow {
  key: string;
  name: string;
  regions: string;
  base: string;
  perKg: string;
  flatbed: string;
  transitDays: string;
}

const dollars = (cents: number) => (cents / 100).toFixed(2);

/**
 * The rate card's destination zones: each zone's regions, base price, rate per billable kg,
 * flatbed surcharge and transit days, plus dimensional weight, crate tare and the closed
 * trailer's limits. Saving adds a rate card version; quotes keep the version they were made with.
 */
export function FreightZonesForm({ initial }: { initial: FreightRules }) {
  const router = useRouter();
  const [zones, setZones] = useState<ZoneRow[]>(
    initial.zones.map((z) => ({ key: z.key, name: z.name, regions: z.regions.join(", "), base: dollars(z.baseCents), perKg: dollars(z.centsPerKg), flatbed: dollars(z.flatbedSurchargeCents), transitDays: String(z.transitDays) })),
  );
  const [defaultZoneKey, setDefault] = useState(initial.defaultZoneKey);
  const [dim, setDim] = useState(String(initial.dimKgPerM3));
  const [tare, setTare] = useState(String(initial.crateTareKgPerM3));
  const [trailer, setTrailer] = useState({ lengthMm: String(initial.closedTrailer.lengthMm), widthMm: String(initial.closedTrailer.widthMm), heightMm: String(initial.closedTrailer.heightMm), maxKg: String(initial.closedTrailer.maxKg) });
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [msg, setMsg] = useState<{ tone: "ok" | "error"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const set = (i: number, k: keyof ZoneRow, v: string) => setZones((zs) => zs.map((z, j) => (j === i ? { ...z, [k]: v } : z)));
  const money = (v: string) => parseMoneyToCents(v) ?? Number.NaN;

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    const res = await saveFreightZones({
      zones: zones.map((z) => ({ key: z.key, name: z.name, regions: z.regions.split(",").map((r) => r.trim()).filter(Boolean), baseCents: money(z.base), centsPerKg: money(z.perKg), flatbedSurchargeCents: money(z.flatbed), transitDays: Number(z.transitDays) })),
      defaultZoneKey,
      dimKgPerM3: Number(dim),
      crateTareKgPerM3: Number(tare),
      closedTrailer: { lengthMm: Number(trailer.lengthMm), widthMm: Number(trailer.widthMm), heightMm: Number(trailer.heightMm), maxKg: Number(trailer.maxKg) },
    });
    setBusy(false);
    if (!res.ok) {
      setErrors(res.fieldErrors ?? {});
      return setMsg({ tone: "error", text: res.message });
    }
    setErrors({});
    setMsg({ tone: "ok", text: `Saved as rate card version ${res.data.version}.` });
    router.refresh();
  }
  const err = (path: string) => errors[path]?.[0];
  const cell = "px-1 py-1 align-top";
  return (
    <form onSubmit={submit} className="space-y-4" aria-label="Freight zones">
      <div className="overflow-x-auto">
        <table className="w-full min-w-[56rem] text-sm">
          <thead>
            <tr className="text-left text-xs text-ink-500">
              <th className={cell}>Zone</th>
              <th className={cell}>Regions (country or subdivision codes, * = elsewhere)</th>
              <th className={cell}>Base per crate, $</th>
              <th className={cell}>Per billable kg, $</th>
              <th className={cell}>Flatbed surcharge, $</th>
              <th className={cell}>Transit, days</th>
              <th className={cell} />
            </tr>
          </thead>
          <tbody>
            {zones.map((z, i) => (
              <tr key={i} className="border-t border-paper-200">
                <td className={cell}>
                  <Input aria-label={`Zone ${i + 1} name`} value={z.name} onChange={(e) => set(i, "name", e.target.value)} />
                  <span className="text-xs text-ink-400">{z.key}</span>
                  {err(`zones.${i}.name`) ? <p className="text-xs text-signal-danger">{err(`zones.${i}.name`)}</p> : null}
                </td>
                <td className={cell}>
                  <Input aria-label={`Zone ${i + 1} regions`} value={z.regions} onChange={(e) => set(i, "regions", e.target.value)} />
                  {err(`zones.${i}.regions`) ? <p className="text-xs text-signal-danger">{err(`zones.${i}.regions`)}</p> : null}
                  {Object.entries(errors).filter(([k]) => k.startsWith(`zones.${i}.regions.`)).map(([k, v]) => <p key={k} className="text-xs text-signal-danger">{v[0]}</p>)}
                </td>
                {(["base", "perKg", "flatbed", "transitDays"] as const).map((k) => (
                  <td key={k} className={`${cell} w-28`}>
                    <Input aria-label={`Zone ${i + 1} ${k}`} inputMode="decimal" value={z[k]} onChange={(e) => set(i, k, e.target.value)} />
                  </td>
                ))}
                <td className={cell}>
                  <Button type="button" size="sm" variant="ghost" disabled={zones.length === 1} onClick={() => setZones((zs) => zs.filter((_, j) => j !== i))}>
                    Remove
                  </Button>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <Button type="button" variant="secondary" size="sm" onClick={() => setZones((zs) => [...zs, { key: `zone-${Date.now().toString(36)}`, name: "", regions: "", base: "0.00", perKg: "0.00", flatbed: "0.00", transitDays: "5" }])}>
        Add a zone
      </Button>
      <div className="grid gap-3 text-sm sm:grid-cols-4">
        <label className="space-y-1">
          <span className="block font-medium text-ink-700">Zone before a ship-to is known</span>
          <Select value={defaultZoneKey} onChange={(e) => setDefault(e.target.value)}>
            {zones.map((z) => (
              <option key={z.key} value={z.key}>
                {z.name || z.key}
              </option>
            ))}
          </Select>
        </label>
        <label className="space-y-1">
          <span className="block font-medium text-ink-700">Dimensional weight, kg per m³</span>
          <Input inputMode="decimal" value={dim} onChange={(e) => setDim(e.target.value)} />
        </label>
        <label className="space-y-1">
          <span className="block font-medium text-ink-700">Crate tare, kg per m³</span>
          <Input inputMode="decimal" value={tare} onChange={(e) => setTare(e.target.value)} />
        </label>
        <div className="space-y-1">
          <span className="block font-medium text-ink-700">Closed trailer inside (mm) and payload (kg)</span>
          <div className="grid grid-cols-4 gap-1">
            {(["lengthMm", "widthMm", "heightMm", "maxKg"] as const).map((k) => (
              <Input key={k} aria-label={`Closed trailer ${k}`} inputMode="decimal" value={trailer[k]} onChange={(e) => setTrailer({ ...trailer, [k]: e.target.value })} />
            ))}
          </div>
        </div>
      </div>
      <p className="text-xs text-ink-500">
        A crate that fits the closed trailer no way round, or is heavier than its payload, is priced on a flatbed with the zone&apos;s surcharge.
        Billable mass is the larger of the crate&apos;s gross mass and its volume times the dimensional weight.
      </p>
      <div className="flex items-center gap-3">
        <Button type="submit" disabled={busy}>
          {busy ? "Saving…" : "Save freight zones"}
        </Button>
        <FormMessage tone={msg?.tone}>{msg?.text}</FormMessage>
      </div>
    </form>
  );
}
