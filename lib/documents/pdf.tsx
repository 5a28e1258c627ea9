import { Document, Font, Page, StyleSheet, Text, View } from "@react-pdf/renderer";
import path from "node:path";
import { spreadMargin } from "../quoting/client-lines";
import { formatCents } from "../money";
import { formatMass, formatSize } from "../units";
import { BUREAU } from "./bureau";
import { KIND_TITLES } from "./numbering";
import type { DocumentData, DocumentLine, DocumentTotals, PackingListData, Party } from "./types";

/**
 * The layout every issued document shares, drawn with @react-pdf/renderer from the frozen
 * snapshot (lib/documents/types.ts). Fonts ship with the app (Inter, SIL Open Font License, from
 * the npm package @fontsource/inter): nothing is fetched at render time.
 */
const FONT_DIR = path.join(process.cwd(), "lib", "documents", "fonts");
let fontsRegistered = false;
export function registerFonts() {
  if (fontsRegistered) return;
  Font.register({
    family: "Inter",
    fonts: [
      { src: path.join(FONT_DIR, "inter-latin-400-normal.woff"), fontWeight: 400 },
      { src: path.join(FONT_DIR, "inter-latin-700-normal.woff"), fontWeight: 700 },
    ],
  });
  // Long words (file names, ids) wrap at any character instead of overflowing the column.
  Font.registerHyphenationCallback((word) => (word.length > 24 ? word.split("") : [word]));
  fontsRegistered = true;
}

const KILN = "#d9692a";
const INK = "#181d23";
const MUTED = "#6b7480";
const RULE = "#e8e3d7";

const s = StyleSheet.create({
  page: { fontFamily: "Inter", fontSize: 9, color: INK, paddingTop: 36, paddingBottom: 56, paddingHorizontal: 40, lineHeight: 1.35 },
  band: { height: 5, backgroundColor: KILN, marginBottom: 14 },
  row: { flexDirection: "row" },
  head: { flexDirection: "row", justifyContent: "space-between", marginBottom: 16 },
  bureauName: { fontSize: 13, fontWeight: 700, lineHeight: 1.3, marginBottom: 2 },
  muted: { color: MUTED },
  title: { fontSize: 18, fontWeight: 700, textAlign: "right", lineHeight: 1.2 },
  number: { fontSize: 11, fontWeight: 700, textAlign: "right", marginTop: 4, lineHeight: 1.2 },
  metaLine: { textAlign: "right", color: MUTED },
  partyBox: { flex: 1, paddingRight: 12 },
  label: { fontSize: 7, color: MUTED, textTransform: "uppercase", letterSpacing: 0.6, marginBottom: 2 },
  bold: { fontWeight: 700 },
  table: { marginTop: 14, borderTopWidth: 1, borderTopColor: INK },
  th: { flexDirection: "row", borderBottomWidth: 1, borderBottomColor: RULE, paddingVertical: 4, fontWeight: 700, fontSize: 8 },
  tr: { flexDirection: "row", borderBottomWidth: 0.5, borderBottomColor: RULE, paddingVertical: 4 },
  cDesc: { flex: 1, paddingRight: 6 },
  cQty: { width: 40, textAlign: "right" },
  cMoney: { width: 78, textAlign: "right" },
  totals: { marginTop: 8, marginLeft: "auto", width: 230 },
  totalRow: { flexDirection: "row", justifyContent: "space-between", paddingVertical: 2 },
  grand: { flexDirection: "row", justifyContent: "space-between", paddingVertical: 4, marginTop: 2, borderTopWidth: 1, borderTopColor: INK, fontWeight: 700, fontSize: 10.5 },
  section: { marginTop: 16 },
  h2: { fontSize: 10, fontWeight: 700, marginBottom: 4 },
  caution: { marginTop: 16, borderWidth: 1, borderColor: KILN, backgroundColor: "#fdf2ea", padding: 8 },
  stamp: { marginTop: 10, alignSelf: "flex-start", borderWidth: 1.5, borderColor: "#2f7d6d", color: "#2f7d6d", paddingVertical: 3, paddingHorizontal: 8, fontWeight: 700 },
  footer: { position: "absolute", bottom: 24, left: 40, width: 515, fontSize: 7, color: MUTED },
});

const day = (iso: string | null) =>
  iso ? new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "long", year: "numeric", timeZone: "UTC" }).format(new Date(iso)) : "—";
const qty = (n: number) => (Number.isInteger(n) ? String(n) : n.toFixed(2));
const pct = (bp: number) => `${(bp / 100).toLocaleString("en-US", { maximumFractionDigits: 2 })}%`;

function PartyBlock({ label, party }: { label: string; party: Party }) {
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

function Lines({ lines: raw, marginCents, currency }: { lines: DocumentLine[]; marginCents: number; currency: string }) {
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

function TaxNote({ note }: { note: string | null | undefined }) {
  if (!note) return null;
  return (
    <View style={[s.section, { marginTop: 8 }]} wrap={false}>
      <Text style={s.bold}>{note}</Text>
    </View>
  );
}

function Totals({ totals, currency, grandLabel, extra }: { totals: DocumentTotals; currency: string; grandLabel: string; extra?: { label: string; cents: number; strong?: boolean }[] }) {
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

function Cautions({ cautions }: { cautions: string[] }) {
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

function Meta({ items }: { items: [string, string | null][] }) {
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

function PackingItems({ d }: { d: PackingListData }) {
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

function Body({ d }: { d: DocumentData }) {
  switch (d.kind) {
    case "quote":
      return (
        <>
          <Meta items={[["Project", d.projectName], ["Request", d.reference], ["Quote version", String(d.version)], ["Valid until", day(d.validUntil)], [d.leadTime && d.leadTime !== "standard" ? `Ship date (${d.leadTime === "expedite" ? "expedited" : "economy"} delivery)` : "Earliest ship date", day(d.shipDate)], ["Deposit", `${pct(d.depositBp)} on acceptance`]]} />
          <Lines lines={d.lines} marginCents={d.totals.marginCents} currency={d.currency} />
          <Totals totals={d.totals} currency={d.currency} grandLabel="Total" extra={[{ label: `Deposit due on acceptance (${pct(d.depositBp)})`, cents: d.depositCents }]} />
          {d.quoteTerms ? (
            <View style={s.section}>
              <Text style={s.h2}>Commercial terms of this quotation</Text>
              <Text>{d.quoteTerms}</Text>
            </View>
          ) : null}
          {d.notes ? (
            <View style={s.section}>
              <Text style={s.h2}>Notes</Text>
              <Text>{d.notes}</Text>
            </View>
          ) : null}
          <View style={s.section}>
            <Text style={s.h2}>Validity</Text>
            <Text>
              This quotation is an offer open until {day(d.validUntil)}. It is accepted on the order page with a purchase order number; accepting it
              accepts {d.terms ? `the terms of sale, version ${d.terms.version}` : "the terms of sale"}. After that date, or once a part&apos;s file changes, ask for a fresh quotation.
            </Text>
          </View>
          <Cautions cautions={d.cautions} />
        </>
      );
    case "deposit_invoice":
      return (
        <>
          <Meta items={[["Project", d.projectName], ["Request", d.reference], ["Quotation", d.quoteNumber ?? `version ${d.quoteVersion}`], ["Order total", formatCents(d.orderTotalCents, d.currency)], ["Terms of sale", d.termsVersion ? `version ${d.termsVersion}` : null]]} />
          <Lines lines={d.lines} marginCents={d.totals.marginCents} currency={d.currency} />
          <Totals totals={d.totals} currency={d.currency} grandLabel="Deposit" extra={d.paidAt ? [{ label: "Amount due", cents: 0, strong: true }] : undefined} />
          <TaxNote note={d.taxNote} />
          {d.paidAt ? <Text style={s.stamp}>{`PAID ${day(d.paidAt)} by ${d.paidBy ?? "card"} · payment ${d.paymentReference}`}</Text> : null}
          <View style={s.section}>
            <Text style={s.muted}>The balance is invoiced when the parts ship. Tax on this deposit is the order&apos;s tax in proportion to the amount.</Text>
          </View>
        </>
      );
    case "invoice":
      return (
        <>
          <Meta items={[["Project", d.projectName], ["Request", d.reference], ["Quotation", d.quoteNumber ?? `version ${d.quoteVersion}`], ["Terms of sale", d.termsVersion ? `version ${d.termsVersion}` : null], ["Payment terms", d.paymentTerms ?? null], ["Due date", d.dueAt ? day(d.dueAt) : null]]} />
          <Lines lines={d.lines} marginCents={d.totals.marginCents} currency={d.currency} />
          <Totals
            totals={d.totals}
            currency={d.currency}
            grandLabel="Order total"
            extra={[
              ...(d.deposit.amountCents > 0 ? [{ label: `Less deposit${d.deposit.invoiceNumber ? ` (${d.deposit.invoiceNumber})` : ""}${d.deposit.isPaid ? ", paid" : ""}`, cents: -d.deposit.amountCents }] : []),
              { label: d.paymentTerms ? `Amount due${d.dueAt ? ` by ${day(d.dueAt)}` : ""}` : "Balance due", cents: d.balanceDueCents, strong: true },
            ]}
          />
          <TaxNote note={d.taxNote} />
          <View style={s.section}>
            <Text style={s.h2}>Payment</Text>
            <Text>{d.dueText}</Text>
            {d.transfer ? (
              <Text>{`By bank transfer: ${d.transfer.bankName}, account holder ${d.transfer.accountHolder}, account ${d.transfer.accountNumber}, routing ${d.transfer.routingNumber}${d.transfer.swiftCode ? `, SWIFT ${d.transfer.swiftCode}` : ""}. Transfer reference: ${d.transfer.reference} (quote it exactly, so the money is matched to this invoice).`}</Text>
            ) : (
              <Text>{BUREAU.bank}</Text>
            )}
            <Text>Please quote {d.number ?? "this invoice's number"} and your PO number with any payment.</Text>
          </View>
          <Cautions cautions={d.cautions} />
        </>
      );
    case "credit_note":
      return (
        <>
          <Meta items={[["Project", d.projectName], ["Request", d.reference], ["Credits invoice", d.invoiceNumber], ["Payment", d.paymentKind]]} />
          <Lines lines={d.lines} marginCents={d.totals.marginCents} currency={d.currency} />
          <Totals totals={d.totals} currency={d.currency} grandLabel="Credited" />
          <TaxNote note={d.taxNote} />
          <View style={s.section}>
            <Text>The amount is returned to the card that paid; it usually appears within 5 to 10 working days.</Text>
          </View>
        </>
      );
    case "packing_list":
      return (
        <>
          <Meta items={[["Project", d.projectName], ["Request", d.reference], ["Shipped", day(d.shippedAt)], ["Carrier", d.carrier], ["Tracking", d.trackingNumber], ["Inspection", d.inspection]]} />
          <PackingItems d={d} />
          {d.totalMassKg !== null ? (
            <Text style={[s.bold, { marginTop: 8, textAlign: "right" }]}>{`Total part mass about ${formatMass(d.totalMassKg, d.unitsPref)} (estimated from the model; crate not included)`}</Text>
          ) : null}
          <Cautions cautions={d.cautions} />
          <View style={[s.row, { marginTop: 28 }]}>
            <View style={{ flex: 1, borderTopWidth: 0.5, borderTopColor: INK, marginRight: 24, paddingTop: 3 }}>
              <Text style={s.muted}>Received in good order (name, signature)</Text>
            </View>
            <View style={{ width: 140, borderTopWidth: 0.5, borderTopColor: INK, paddingTop: 3 }}>
              <Text style={s.muted}>Date</Text>
            </View>
          </View>
        </>
      );
  }
}

function Footer({ text }: { text: string }) {
  return (
    <Text style={s.footer} fixed>
      {text}
    </Text>
  );
}

function TermsPage({ data, title, number }: { data: DocumentData; title: string; number: string }) {
  if (data.kind !== "quote" || !data.terms) return null;
  return (
    <Page size="A4" style={s.page}>
      <View style={s.band} fixed />
      <Footer text={`${title} ${number} · ${data.reference} · ${data.bureau.name}`} />
      <Text style={[s.h2, { fontSize: 12 }]}>{`${data.terms.title}, version ${data.terms.version}`}</Text>
      <Text style={[s.muted, { marginBottom: 8 }]}>{`Part of quotation ${number}; accepting the quotation accepts these terms.`}</Text>
      {data.terms.paragraphs.map((p, i) => (
        <Text key={i} style={{ marginBottom: 5 }}>
          {p}
        </Text>
      ))}
    </Page>
  );
}

/** One issued document as a react-pdf tree. */
export function IssuedDocumentPdf({ data }: { data: DocumentData }) {
  const title = KIND_TITLES[data.kind];
  const number = data.number ?? "";
  return (
    <Document title={`${title} ${number}`} author={data.bureau.name} subject={`${data.reference} ${data.projectName}`} creator="Layerwright" producer="Layerwright">
      <Page size="A4" style={s.page}>
        <View style={s.band} fixed />
        <Footer text={`${title} ${number} · ${data.reference} · ${data.bureau.name}`} />
        <View style={s.head}>
          <View style={{ flex: 1 }}>
            <Text style={s.bureauName}>{data.bureau.name}</Text>
            {data.bureau.lines.map((l) => (
              <Text key={l} style={s.muted}>
                {l}
              </Text>
            ))}
          </View>
          <View style={{ width: 220 }}>
            <Text style={s.title}>{title}</Text>
            <Text style={s.number}>{number}</Text>
            <Text style={s.metaLine}>{`Issued ${day(data.issuedAt)}`}</Text>
            {data.poNumber ? <Text style={s.metaLine}>{`Your PO ${data.poNumber}`}</Text> : null}
          </View>
        </View>
        <View style={s.row}>
          {data.kind === "packing_list" && data.shipTo ? <PartyBlock label="Deliver to" party={data.shipTo} /> : null}
          <PartyBlock label={data.kind === "packing_list" ? (data.shipTo ? "Customer" : "Deliver to") : data.kind === "quote" ? "Prepared for" : "Bill to"} party={data.client} />
          {data.kind !== "packing_list" && data.shipTo ? <PartyBlock label={data.kind === "quote" ? "Freight priced to (your default ship-to)" : "Ship to"} party={data.shipTo} /> : null}
        </View>
        <Body d={data} />
      </Page>
      <TermsPage data={data} title={title} number={number} />
    </Document>
  );
}
