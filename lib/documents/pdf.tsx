import { Document, Page, Text, View } from "@react-pdf/renderer";
import { formatCents } from "../money";
import { formatMass } from "../units";
import { BUREAU } from "./bureau";
import { KIND_TITLES } from "./numbering";
import { Cautions, Footer, Lines, Meta, PackingItems, PartyBlock, TaxNote, Totals } from "./pdf-blocks";
import { day, INK, pct, s } from "./pdf-theme";
import type { DocumentData } from "./types";

/**
 * The layout every issued document shares, drawn with @react-pdf/renderer from the frozen
 * snapshot (lib/documents/types.ts): the head, the parties, then each kind's body. The theme and
 * fonts are in ./pdf-theme.ts, the blocks in ./pdf-blocks.tsx.
 */

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
