import type { Metadata } from "next";
import { getDb } from "@/db/client";
import { getQuoteWithRequest, listClientQuotes } from "@/db/queries/client-quotes";
import { acceptanceContext } from "@/lib/orders/acceptance";
import { openOnAccountCents } from "@/db/queries/account-terms";
import { INVOICE_STANDING_LABEL, INVOICE_STANDING_TONE, PAYMENT_TERMS_LABEL } from "@/lib/labels";
import { invoiceStanding } from "@/lib/payments/terms";
import { addressLines } from "@/lib/validation/address";
import { listDocuments } from "@/db/queries/documents";
import { listIssuedDocuments } from "@/db/queries/issued-documents";
import { listMessages } from "@/db/queries/messages";
import { getOrganisation } from "@/db/queries/organisations";
import { listPartsWithAnalysis } from "@/db/queries/parts";
import { getOrderByRequest, listPaymentsForOrder } from "@/db/queries/payments";
import { getRequest, listStageEvents } from "@/db/queries/requests";
import type { Stage } from "@/db/schema/common";
import { CheckoutReturn } from "@/app/(portal)/portal/requests/[id]/_components/checkout-return";
import { FigureKind } from "@/app/(portal)/portal/requests/_components/estimate-panel";
import { MessagesThread } from "@/app/(portal)/portal/requests/[id]/_components/messages";
import { PayButton, PaymentsList, TransferButton, TransferInstructions } from "@/app/(portal)/portal/requests/[id]/_components/payments";
import { QuotesSection } from "@/app/(portal)/portal/requests/[id]/_components/quotes";
import { RequestForm } from "@/app/(portal)/portal/requests/_components/request-form/request-form";
import { loadDraft, loadFormCatalogue } from "@/app/(portal)/portal/requests/_components/request-form/load";
import { clientEstimateOf } from "@/lib/estimating/client-view";
import { PartReview } from "@/app/(portal)/portal/requests/_components/request-form/part-review";
import { StageBadge } from "@/components/stage-badge";
import { ShipToBlock } from "@/components/ship-to";
import { RevisionUpload } from "@/app/(portal)/portal/requests/[id]/_components/revision-upload";
import { StageTimeline } from "@/app/(portal)/portal/requests/[id]/_components/timeline";
import { listShipDateChanges } from "@/db/queries/ship-dates";
import { IssuedDocumentsList } from "@/components/issued-documents";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Card, CardTitle, EmptyState, PageHeader } from "@/components/ui/card";
import { assertCanSee } from "@/lib/auth/guard";
import { orPageError, pageUser } from "@/lib/auth/page-guard";
import { getBureauSettings, getFileRetention } from "@/db/queries/retention";
import { FINISHED_STAGES } from "@/lib/retention/policy";
import { ModelFilesCard } from "./_components/model-files-card";
import { can, canReadDocument } from "@/lib/auth/policy";
import { documentUrl } from "@/lib/documents/links";
import type { EstimateResult } from "@/lib/estimating/types";
import { CURE_LABEL, DOCUMENT_KIND_LABEL } from "@/lib/labels";
import { formatCents } from "@/lib/money";
import { formatTempBoth } from "@/lib/units";
import { formatDate, formatDay } from "@/lib/dates";

export const metadata: Metadata = { title: "Request" };
export const dynamic = "force-dynamic";


const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);

export default async function RequestPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<Record<string, string | undefined>> }) {
  const { id } = await params;
  const sp = await searchParams;
  const user = await pageUser(`/portal/requests/${id}`);
  const db = getDb();
  const req = await orPageError(async () => {
    const r = await getRequest(db, id);
    assertCanSee(user, r ? { orgId: r.orgId, createdById: r.createdById } : null, "request");
    return r!;
  });
  const units = user.unitsPref;

  if (req.stage === "draft" && can(user, "request:edit_draft", { orgId: req.orgId, createdById: req.createdById })) {
    const [catalogue, draft] = await Promise.all([loadFormCatalogue(db, units), loadDraft(db, req, units)]);
    return (
      <>
        <PageHeader title={req.projectName || "New request"} subtitle={`Draft ${req.reference} — not sent to the bureau yet.`} />
        <RequestForm initial={draft.values} initialFiles={draft.files} reference={req.reference} catalogue={catalogue} />
      </>
    );
  }

  const [parts, quotes, order, events, messages, documents, catalogue, org, issuedAll] = await Promise.all([
    listPartsWithAnalysis(db, req.id),
    listClientQuotes(db, req.id),
    getOrderByRequest(db, req.id),
    listStageEvents(db, req.id),
    listMessages(db, req.id),
    listDocuments(db, req.id),
    loadFormCatalogue(db, units),
    getOrganisation(db, req.orgId),
    listIssuedDocuments(db, req.id),
  ]);
  const issued = issuedAll.filter((d) => canReadDocument(user, d.kind, { orgId: req.orgId, createdById: req.createdById }));
  const [payments, dateChanges] = order ? await Promise.all([listPaymentsForOrder(db, order.id), listShipDateChanges(db, order.id)]) : [[], []];
  const isFinished = (FINISHED_STAGES as readonly string[]).includes(req.stage);
  const [retention, fileState] = isFinished ? await Promise.all([getBureauSettings(db), getFileRetention(db, req.id)]) : [null, null];
  const finishedAt = isFinished ? ([...events].reverse().find((e) => e.toStage === req.stage)?.at ?? null) : null;
  const paid = (kind: "deposit" | "balance") => payments.some((p) => p.kind === kind && (p.status === "paid" || p.status.includes("refunded")));
  const acceptedQuote = quotes.find((q) => q.status === "accepted");
  const planned: Partial<Record<Stage, Date | null>> = {
    printing: order?.plannedStart ?? null,
    shipped: order?.plannedShip ?? acceptedQuote?.shipDate ?? quotes[0]?.shipDate ?? null,
  };
  const canPay = can(user, "payment:pay", { orgId: req.orgId, createdById: req.createdById });
  const canAccept = can(user, "quote:accept", { orgId: req.orgId, createdById: req.createdById }) && req.stage === "quoted";
  const open = canAccept ? quotes.find((q) => q.status === "issued") : undefined;
  const openQuote = open ? (await getQuoteWithRequest(db, open.id))?.quote : undefined;
  const acceptCtx = openQuote ? await acceptanceContext(db, { quote: openQuote, orgId: req.orgId, requestId: req.id, now: new Date() }) : null;
  const canRevise = (req.stage === "submitted" || req.stage === "quoted") && can(user, "request:edit_draft", { orgId: req.orgId, createdById: req.createdById });
  const checkout = sp.checkout === "success" || sp.checkout === "cancelled" ? sp.checkout : null;
  const account = acceptCtx && org && org.paymentTerms !== "prepay" ? { termsLabel: PAYMENT_TERMS_LABEL[org.paymentTerms], limitCents: org.creditLimitCents, openCents: await openOnAccountCents(db, req.orgId) } : null;
  const onAccount = order ? order.paymentTerms !== "prepay" : false;
  const transfers = payments
    .filter((p) => p.status === "pending" && p.method === "bank_transfer" && p.transferReference && p.transferDetails)
    .map((p) => ({ kind: p.kind, reference: p.transferReference!, ...p.transferDetails!, amountCents: p.amountCents, receivedCents: p.receivedCents, currency: p.currency }));
  const standing = order && onAccount ? invoiceStanding({ dueAt: order.dueAt, isPaid: paid("balance"), now: new Date() }) : null;

  return (
    <>
      <PageHeader
        title={req.projectName}
        subtitle={
          <span className="flex flex-wrap items-center gap-2">
            <span className="font-mono">{req.reference}</span>
            <span data-testid="request-stage" data-stage={req.stage}>
              <StageBadge stage={req.stage} onAccount={Boolean(order && order.paymentTerms !== "prepay")} />
            </span>
            {req.isControlled ? <Badge tone="warn">Controlled data</Badge> : null}
            <span>
              {CURE_LABEL[req.cureProcess]}{req.cureTempC !== null ? ` at ${formatTempBoth(req.cureTempC, units)}` : ""} · needed by {formatDay(req.neededBy)}
            </span>
          </span>
        }
      />
      <div className="space-y-6">
        {sp.submitted ? <Alert tone="info" title="Sent to the bureau">Our sales engineers review the analysis and issue a quote; you will get an e-mail.</Alert> : null}
        {checkout ? <CheckoutReturn requestId={req.id} outcome={checkout} stage={req.stage} /> : null}

        <div className="grid gap-6 lg:grid-cols-3">
          <div className="min-w-0 space-y-6 lg:col-span-2">
            {order ? (
              <Card className="space-y-4" aria-label="Order and payments">
                <div className="flex flex-wrap items-center gap-2">
                  <CardTitle>Order</CardTitle>
                  <FigureKind kind="quote" />
                  <span className="text-sm text-ink-500">PO {order.poNumber}</span>
                </div>
                <dl className="grid grid-cols-3 gap-3 text-sm">
                  <div>
                    <dt className="text-xs text-ink-500">Total</dt>
                    <dd className="figures font-semibold">{formatCents(order.totalCents, order.currency)}</dd>
                  </div>
                  <div>
                    <dt className="text-xs text-ink-500">Deposit</dt>
                    <dd className="figures">{onAccount ? "None (on account)" : formatCents(order.depositCents, order.currency)} {paid("deposit") ? <Badge tone="ok">paid</Badge> : null}</dd>
                  </div>
                  <div>
                    <dt className="text-xs text-ink-500">{onAccount ? "Invoiced on account" : "Balance"}</dt>
                    <dd className="figures">{formatCents(order.balanceCents, order.currency)} {paid("balance") ? <Badge tone="ok">paid</Badge> : null}</dd>
                  </div>
                </dl>
                {order && onAccount && standing ? (
                  <p className="flex flex-wrap items-center gap-2 text-sm" data-testid="terms-line">
                    <span>
                      On account, {PAYMENT_TERMS_LABEL[order.paymentTerms]}
                      {order.dueAt ? <>: due by <strong>{formatDate(order.dueAt)}</strong></> : ": invoiced when the order ships"}.
                    </span>
                    <Badge tone={INVOICE_STANDING_TONE[standing]}>{INVOICE_STANDING_LABEL[standing]}</Badge>
                  </p>
                ) : null}
                {transfers.map((t) => (
                  <TransferInstructions key={t.reference} t={t} />
                ))}
                {canPay && req.stage === "accepted" && !paid("deposit") ? (
                  <div className="flex flex-wrap items-start gap-3">
                    {/* Once money came by transfer, the rest comes the same way (a card page would take the whole again). */}
                    {!transfers.some((t) => t.kind === "deposit" && t.receivedCents > 0) ? <PayButton orderId={order.id} kind="deposit" amountCents={order.depositCents} currency={order.currency} /> : null}
                    {!transfers.some((t) => t.kind === "deposit") ? <TransferButton orderId={order.id} kind="deposit" /> : null}
                  </div>
                ) : null}
                {canPay && (req.stage === "shipped" || req.stage === "delivered") && !paid("balance") && order.balanceCents > 0 ? (
                  <div className="flex flex-wrap items-start gap-3">
                    {!transfers.some((t) => t.kind === "balance" && t.receivedCents > 0) ? <PayButton orderId={order.id} kind="balance" amountCents={order.balanceCents} currency={order.currency} /> : null}
                    {!transfers.some((t) => t.kind === "balance") ? <TransferButton orderId={order.id} kind="balance" /> : null}
                  </div>
                ) : null}
                <ShipToBlock shipTo={order.shipTo} />
                {order.taxExemption ? <p className="text-sm text-tide-700">No tax: exemption certificate {order.taxExemption.certificateNumber} ({order.taxExemption.issuedBy}).</p> : null}
                {order.carrier || order.trackingNumber ? (
                  <p className="text-sm">
                    Shipped with {order.carrier ?? "our carrier"}
                    {order.trackingNumber ? `, tracking ${order.trackingNumber}` : ""}.
                  </p>
                ) : null}
                <PaymentsList payments={payments.map((p) => ({ id: p.id, kind: p.kind, method: p.method, status: p.status, receiptNumber: p.receiptNumber, amountCents: p.amountCents, currency: p.currency, createdAt: p.createdAt.toISOString(), paidAt: iso(p.paidAt) }))} />
              </Card>
            ) : null}

            <QuotesSection
              quotes={quotes.map((q) => {
                const doc = issued.find((d) => d.kind === "quote" && d.sourceId === q.id);
                return { ...q, shipDate: iso(q.shipDate), issuedAt: iso(q.issuedAt), validUntil: iso(q.validUntil), pdf: doc ? { number: doc.number, url: documentUrl(doc.id) } : null };
              })}
              canAccept={canAccept}
              defaultPo={org?.defaultPoNumber ?? ""}
              acceptance={
                acceptCtx
                  ? {
                      shipTos: acceptCtx.shipTos.map((o) => ({
                        id: o.address.id, label: o.address.label, lines: addressLines(o.address), isDefault: o.address.isDefault,
                        zoneName: o.zone?.name ?? null, transitDays: o.zone?.transitDays ?? null,
                        freightCents: o.figures.freightCents, taxCents: o.figures.isChanged ? o.figures.taxCents : (openQuote?.taxCents ?? 0),
                        totalCents: o.figures.isChanged ? o.figures.totalCents : (openQuote?.totalCents ?? 0),
                        depositCents: o.figures.isChanged ? o.figures.depositCents : (openQuote?.depositCents ?? 0),
                      })),
                      exemption: acceptCtx.exemption ? { certificateNumber: acceptCtx.exemption.certificateNumber, expiresOn: acceptCtx.exemption.expiresOn.toISOString() } : null,
                      canManageAddresses: user.role === "client_admin",
                      account,
                    }
                  : null
              }
              now={new Date().toISOString()}
            />

            {parts.length === 0 ? <EmptyState title="This request has no parts" /> : null}
            {parts.map(({ part, revision, analysis }) => (
              <div key={part.id} className="space-y-2">
                {revision && analysis?.status === "done" && analysis.result ? (
                  <PartReview
                    key={part.id}
                    title={`${part.name} · ${revision.fileName}${revision.revision > 1 ? ` (revision ${revision.revision})` : ""} · qty ${part.quantity}`}
                    revisionId={revision.id}
                    result={clientEstimateOf(analysis.result) as EstimateResult}
                    fileUnits={part.units}
                    displayUnits={units}
                    cells={catalogue.cells}
                    cureTempC={req.cureTempC}
                    isPreviewOnDemand={parts.length > 1}
                  />
                ) : (
                  <Card key={part.id}>
                    <CardTitle>{part.name}</CardTitle>
                    <p className="mt-2 text-sm text-ink-500">
                      {!revision ? "No file." : analysis?.status === "failed" ? `The file could not be analysed: ${analysis.errorMessage}` : "The analysis is still running."}
                    </p>
                  </Card>
                )}
                {canRevise ? <RevisionUpload requestId={req.id} partId={part.id} fileName={revision?.fileName ?? null} /> : null}
              </div>
            ))}
          </div>

          <div className="min-w-0 space-y-6">
            {retention ? (
              <ModelFilesCard requestId={req.id} finishedAt={finishedAt} retentionDays={retention.modelRetentionDays} state={fileState} canDelete={user.role === "client_admin"} />
            ) : null}
            <Card>
              <CardTitle className="mb-3">Timeline</CardTitle>
              <StageTimeline stage={req.stage} events={[
                  ...(events.some((e) => e.toStage === "draft") ? [] : [{ toStage: "draft" as const, at: req.createdAt, note: "Draft started", actorName: null }]),
                  ...events.map((e) => ({ toStage: e.toStage, at: e.at, note: e.note, actorName: e.actorName })),
                ]} planned={planned} dateChanges={dateChanges} />
            </Card>
            <Card>
              <CardTitle className="mb-3">Documents</CardTitle>
              <IssuedDocumentsList docs={issued} empty="Quotations, invoices, credit notes and the packing list appear here as PDFs once issued." />
              {documents.filter((d) => !d.messageId).length > 0 ? (
                <div className="mt-4 border-t border-paper-200 pt-3">
                  <p className="text-xs font-medium uppercase tracking-wide text-ink-500">Reports and attachments</p>
                  <ul className="mt-1 space-y-2 text-sm">
                    {documents
                      .filter((d) => !d.messageId)
                      .map((d) => (
                        <li key={d.id} className="flex items-center gap-2">
                          <Badge>{DOCUMENT_KIND_LABEL[d.kind] ?? d.kind}</Badge>
                          {d.hasFile ? (
                            <a href={`/api/files/${d.id}`} className="text-kiln-700 underline">
                              {d.title}
                            </a>
                          ) : (
                            <span>{d.title}</span>
                          )}
                        </li>
                      ))}
                  </ul>
                </div>
              ) : null}
              {parts.some((p) => p.revision) ? (
                <div className="mt-4 border-t border-paper-200 pt-3">
                  <p className="text-xs font-medium uppercase tracking-wide text-ink-500">Your files</p>
                  <ul className="mt-1 space-y-1 text-sm">
                    {parts.map((p) =>
                      p.revision ? (
                        <li key={p.part.id}>
                          <a href={`/api/files/${p.revision.id}`} className="text-kiln-700 underline">
                            {p.revision.fileName}
                          </a>{" "}
                          <span className="text-xs text-ink-400">rev {p.revision.revision}</span>
                        </li>
                      ) : null,
                    )}
                  </ul>
                </div>
              ) : null}
            </Card>
            <Card>
              <CardTitle className="mb-3">Messages</CardTitle>
              <MessagesThread
                requestId={req.id}
                messages={messages.map((m) => ({ id: m.id, parentId: m.parentId, body: m.body, isFromStaff: m.isFromStaff, createdAt: m.createdAt.toISOString(), authorName: m.authorName, attachments: m.attachments }))}
              />
            </Card>
          </div>
        </div>
      </div>
    </>
  );
}
