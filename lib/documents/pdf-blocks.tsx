import { Text, View } from "@react-pdf/renderer";
import { spreadMargin } from "../quoting/client-lines";
import { formatCents } from "../money";
import { formatMass, formatSize } from "../units";
import { pct, qty, s } from "./pdf-theme";
import type { DocumentLine, DocumentTotals, PackingListData, Party } from "./types";

/** The blocks the issued documents are drawn from (./pdf.tsx lays them out per kind). */

export function PartyBlock({ label, party }: { label: string; party: Party }) {
  return (
    <View style={s.partyBox}>
      <Text style={s.label}>{label}</Text>
      <Text style={s.bold}>{party.name}</Text>
      {party.lines.map((l) => (
        <Text key={l}>{l}</Text>
      ))}
    </View>
  );
}

/**
 * The lines as the client reads them: the bureau's margin inside each line's amount (as on every
 * client screen, lib/quoting/client-lines.ts), a unit price from that amount, and no line that does
 * not apply (quantity 0, e.g. a cooling dwell the plan did not need).
 */
export function linesAsBilled(lines: DocumentLine[], marginCents: number): DocumentLine[] {
  return spreadMargin(
    lines.filter((l) => l.quantity !== 0),
    marginCents,
  ).map((l) => ({ ...l, unitCents: l.quantity > 0 ? Math.round(l.amountCents / l.quantity) : l.amountCents }));
}

export function Lines({ lines: raw, marginCents, currency }: { lines: DocumentLine[]; marginCents: number; currency: string }) {
  const lines = linesAsBilled(raw, marginCents);
  return (
    <View style={s.table}>
      <View style={s.th} fixed>
        <Text style={s.cDesc}>Description</Text>
        <Text style={s.cQty}>Qty</Text>
        <Text style={s.cMoney}>Unit price</Text>
        <Text style={s.cMoney}>Amount</Text>
      </View>
      {lines.map((l, i) => (
        <View key={i} style={s.tr} wrap={false}>
          <Text style={s.cDesc}>{l.description}</Text>
          <Text style={s.cQty}>{qty(l.quantity)}</Text>
          <Text style={s.cMoney}>{formatCents(l.unitCents, currency)}</Text>
          <Text style={s.cMoney}>{formatCents(l.amountCents, currency)}</Text>
        </View>
      ))}
    </View>
  );
}

export function TaxNote({ note }: { note: string | null | undefined }) {
  if (!note) return null;
  return (
    <View style={[s.section, { marginTop: 8 }]} wrap={false}>
      <Text style={s.bold}>{note}</Text>
    </View>
  );
}

export function Totals({ totals, currency, grandLabel, extra }: { totals: DocumentTotals; currency: string; grandLabel: string; extra?: { label: string; cents: number; strong?: boolean }[] }) {
  return (
    <View style={s.totals} wrap={false}>
      <View style={s.totalRow}>
        <Text>Subtotal</Text>
        <Text>{formatCents(totals.subtotalCents + totals.marginCents, currency)}</Text>
      </View>
      <View style={s.totalRow}>
        <Text>{totals.taxBp === 0 && totals.taxCents === 0 ? "Tax (none)" : `Tax (${pct(totals.taxBp)})`}</Text>
        <Text>{formatCents(totals.taxCents, currency)}</Text>
      </View>
      <View style={s.grand}>
        <Text>{grandLabel}</Text>
        <Text>{formatCents(totals.totalCents, currency)}</Text>
      </View>
      {(extra ?? []).map((e) => (
        <View key={e.label} style={e.strong ? s.grand : s.totalRow}>
          <Text>{e.label}</Text>
          <Text>{formatCents(e.cents, currency)}</Text>
        </View>
      ))}
    </View>
  );
}

export function Cautions({ cautions }: { cautions: string[] }) {
  if (cautions.length === 0) return null;
  return (
    <View style={s.caution} wrap={false}>
      <Text style={[s.bold, { color: "#93401a", marginBottom: 3 }]}>Safety</Text>
      {cautions.map((c) => (
        <Text key={c}>• {c}</Text>
      ))}
    </View>
  );
}

export function Meta({ items }: { items: [string, string | null][] }) {
  return (
    <View style={[s.row, { marginTop: 12, flexWrap: "wrap" }]}>
      {items
        .filter((i): i is [string, string] => Boolean(i[1]))
        .map(([k, v]) => (
          <View key={k} style={{ width: "25%", marginBottom: 6, paddingRight: 8 }}>
            <Text style={s.label}>{k}</Text>
            <Text>{v}</Text>
          </View>
        ))}
    </View>
  );
}

export function PackingItems({ d }: { d: PackingListData }) {
  return (
    <View style={s.table}>
      <View style={s.th} fixed>
        <Text style={s.cDesc}>Part</Text>
        <Text style={s.cQty}>Qty</Text>
        <Text style={{ width: 90, paddingLeft: 10 }}>Material</Text>
        <Text style={{ width: 110 }}>Size (x × y × z)</Text>
        <Text style={{ width: 70, textAlign: "right" }}>Mass each</Text>
      </View>
      {d.items.map((i, n) => (
        <View key={n} style={s.tr} wrap={false}>
          <View style={s.cDesc}>
            <Text style={s.bold}>{i.part}</Text>
            {i.fileName ? <Text style={s.muted}>{`${i.fileName}${i.revision ? `, revision ${i.revision}` : ""}`}</Text> : null}
          </View>
          <Text style={s.cQty}>{i.quantity}</Text>
          <Text style={{ width: 90, paddingLeft: 10 }}>{i.material}</Text>
          <Text style={{ width: 110 }}>{i.sizeMm ? formatSize(i.sizeMm, d.unitsPref) : "—"}</Text>
          <Text style={{ width: 70, textAlign: "right" }}>{i.partMassKg !== null ? formatMass(i.partMassKg, d.unitsPref) : "—"}</Text>
        </View>
      ))}
    </View>
  );
}

export function Footer({ text }: { text: string }) {
  return (
    <Text style={s.footer} fixed>
      {text}
    </Text>
  );
}
