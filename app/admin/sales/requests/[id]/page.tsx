import { leadTimeLines, requestLeadTimes } from "@/lib/quoting/lead-times";
import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { AnalysisPanel } from "@/app/admin/sales/requests/[id]/_components/analysis-panel";
import { dateText } from "@/components/admin/format";
import { MessageThread } from "@/app/admin/sales/requests/[id]/_components/message-thread";
import { QuoteEditor } from "@/app/admin/sales/requests/[id]/_components/quote-editor";
import { QuoteNoticeProvider } from "@/app/admin/sales/requests/[id]/_components/quote-notice";
import { QuoteStateBadge, StageBadge } from "@/components/stage-badge";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { OrderDocumentsCard } from "@/components/admin/order-documents";
import { Card, CardTitle, PageHeader } from "@/components/ui/card";
import { getDb } from "@/db/client";
import { getCurrentRateCard, listCurrentMaterials } from "@/db/queries/catalogue";
import { getRequestForSales } from "@/db/queries/sales-requests";
import { listMessages } from "@/db/queries/messages";
import { listQuoteLines, listQuotesForRequest } from "@/db/queries/quotes";
import { getBureauSettings } from "@/db/queries/retention";
import { pagePermission } from "@/lib/auth/page-guard";
import { retentionText } from "@/lib/retention/policy";
import { formatCents } from "@/lib/money";
import { label } from "@/lib/orders/stages";
import { CURE_LABEL } from "@/lib/labels";
import { formatTempBoth } from "@/lib/units";
import { linesFromEstimates, type DraftLine } from "@/lib/quoting/lines";

export const metadata: Metadata = { title: "Request" };
export const dynamic = "force-dynamic";

export default async function SalesRequestPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const user = await pagePermission("sales:inbox", `/admin/sales/requests/${id}`);
  const db = getDb();
  const sales = await getRequestForSales(db, id);
  if (!sales) notFound();
  const { request, parts } = sales;
  const [quotes, messages, card, materials, settings] = await Promise.all([listQuotesForRequest(db, id), listMessages(db, id), getCurrentRateCard(db), listCurrentMaterials(db, { activeOnly: false }), getBureauSettings(db)]);
  const materialNames = new Map(materials.map((m) => [m.key, m.params.name]));
  const draft = quotes.find((q) => q.status === "draft");
  // A new version starts from the last version sales wrote (its lines and rates), unless a part
  // has a new revision since (stale): then from the fresh estimate.
  const previous = draft ? null : quotes.find((q) => q.status !== "draft" && !q.isStale);
  const basis = draft ?? previous;
  const basisAnalysisIds = parts.map((p) => p.analysis?.id).filter((x): x is string => Boolean(x));
  const estimated = parts.filter((p) => p.analysis?.status === "done" && p.analysis.result).map((p) => ({ partId: p.id, partName: p.name, result: p.analysis!.result! }));
  // the client's delivery choice, if every part's estimate still offers it; else standard
  const choices = requestLeadTimes(estimated.map((e) => e.result));
  const choice = choices.find((c) => c.key === request.leadTime) ?? choices[0] ?? null;
  const estimateLines = [
    ...linesFromEstimates(estimated.map((e) => ({ partId: e.partId, partName: e.partName, lines: e.result.lines ?? [] }))),
    ...leadTimeLines(estimated.map((e) => ({ partId: e.partId, partName: e.partName, leadTimes: e.result.leadTimes })), choice?.key ?? "standard"),
  ];
  const basisLines: DraftLine[] | null = basis
    ? (await listQuoteLines(db, basis.id)).map((l) => ({ partId: l.partId, kind: l.kind, description: l.description, quantity: l.quantity, unitCents: l.unitCents, amountCents: l.amountCents, estimatedCents: l.estimatedCents, editReason: l.editReason }))
    : null;
  const rc = card?.params;
  const canQuote = request.stage === "submitted" || request.stage === "quoted";
  const initial = basis
    ? { lines: basisLines ?? [], marginBp: basis.marginBp, taxBp: basis.taxBp, depositBp: basis.depositBp, validityDays: basis.validityDays, terms: basis.terms, notes: basis.notes, shipDate: basis.shipDate?.toISOString().slice(0, 10) ?? null, leadTime: basis.leadTime }
    : {
        lines: estimateLines,
        marginBp: rc?.marginBp ?? 0,
        taxBp: rc?.taxBp ?? 0,
        depositBp: rc?.depositBp ?? 5000,
        validityDays: rc?.quoteValidityDays ?? 30,
        terms: `Deposit due on acceptance; balance due on shipment. Prices exclude duties. Parts are made to the files supplied; the client's own engineering sign-off governs use. Model files are deleted ${retentionText(settings.modelRetentionDays)} after the order closes; documents are kept.`,
        notes: "",
        shipDate: choice?.shipDate ?? parts[0]?.analysis?.result?.shipDate ?? null,
        leadTime: choice?.key ?? "standard",
      };

  return (
    <>
      <PageHeader
        title={`${request.reference} · ${request.projectName}`}
        subtitle={
          <span className="flex flex-wrap items-center gap-2">
            {request.firmName} · needed by {dateText(request.neededBy)} · submitted {dateText(request.submittedAt)} · {CURE_LABEL[request.cureProcess].toLowerCase()}
            {request.cureTempC !== null ? ` at ${formatTempBoth(request.cureTempC, "mm")}` : ""} <StageBadge stage={request.stage} heldFrom={request.heldFromStage} />
            {request.isControlled ? <Badge tone="danger">controlled</Badge> : null}
          </span>
        }
      />
      <div className="grid gap-6 lg:grid-cols-[1fr_22rem]">
        <div className="min-w-0 space-y-4">
          {request.notes ? <Alert tone="info" title="Client notes">{request.notes}</Alert> : null}
          {parts.length === 0 ? <Card><p className="text-sm text-ink-500">This request has no parts.</p></Card> : parts.map((p) => <AnalysisPanel key={p.id} part={p} materialName={materialNames.get(p.materialKey)} />)}
          {canQuote ? (
            <QuoteNoticeProvider>
              <QuoteEditor key={draft?.id ?? `after-${previous?.id ?? "estimate"}`} startedFrom={draft ? null : previous ? previous.version : 0} requestId={id} quoteId={draft?.id} basisAnalysisIds={basisAnalysisIds} initial={initial} isStale={Boolean(draft?.isStale)} />
            </QuoteNoticeProvider>
          ) : (
            <Alert tone="info" title={`The request is at ${label(request.stage)}`}>Quotes are made while a request is submitted or quoted.</Alert>
          )}
        </div>
        <aside className="space-y-4">
          <Card>
            <CardTitle>Versions</CardTitle>
            {quotes.length === 0 ? (
              <p className="mt-2 text-sm text-ink-500">No quote yet.</p>
            ) : (
              <ul className="mt-2 divide-y divide-paper-200 text-sm">
                {quotes.map((q) => (
                  <li key={q.id} className="flex items-center justify-between gap-2 py-2">
                    <span>v{q.version} <QuoteStateBadge state={q.status} /> {q.isStale ? <Badge tone="warn">stale</Badge> : null}</span>
                    <span className="figures">{formatCents(q.totalCents, q.currency)}</span>
                  </li>
                ))}
              </ul>
            )}
          </Card>
          <OrderDocumentsCard requestId={request.id} user={user} />
          <Card>
            <CardTitle>Messages</CardTitle>
            <div className="mt-2">
              <MessageThread requestId={id} isControlled={request.isControlled} messages={messages.map((m) => ({ ...m, createdAt: m.createdAt.toISOString() }))} />
            </div>
          </Card>
        </aside>
      </div>
    </>
  );
}
