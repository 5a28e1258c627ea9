import { getDb } from "@/db/client";
import { getQuoteWithRequest, listClientQuotes } from "@/db/queries/client-quotes";
import { acceptanceContext } from "@/lib/orders/acceptance";
import { openOnAccountCents } from "@/db/queries/account-terms";
import { PAYMENT_TERMS_LABEL } from "@/lib/labels";
import { addressLines } from "@/lib/validation/address";
import { listDocuments } from "@/db/queries/documents";
import { listIssuedDocuments } from "@/db/queries/issued-documents";
import { listMessages } from "@/db/queries/messages";
import { getOrganisation } from "@/db/queries/organisations";
import { listPartsWithAnalysis } from "@/db/queries/parts";
import { getOrderByRequest, listPaymentsForOrder } from "@/db/queries/payments";
import type { getRequest } from "@/db/queries/requests";
import { listStageEvents } from "@/db/queries/requests";
import type { Stage } from "@/db/schema/common";
import { CheckoutReturn } from "./checkout-return";
import { MessagesThread } from "./messages";
import { QuotesSection } from "./quotes";
import { loadFormCatalogue } from "@/app/(portal)/portal/(member)/requests/_components/request-form/load";
import { StageBadge } from "@/components/stage-badge";
import { StageTimeline } from "./timeline";
import { listShipDateChanges } from "@/db/queries/ship-dates";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Card, CardTitle, PageHeader } from "@/components/ui/card";
import type { CurrentUser } from "@/lib/auth/guard";
import { getBureauSettings, getFileRetention } from "@/db/queries/retention";
import { FINISHED_STAGES } from "@/lib/retention/policy";
import { ModelFilesCard } from "./model-files-card";
import { can, canReadDocument } from "@/lib/auth/policy";
import { documentUrl } from "@/lib/documents/links";
import { CURE_LABEL } from "@/lib/labels";
import { formatTempBoth } from "@/lib/units";
import { formatDay } from "@/lib/dates";
import { OrderCard } from "./order-card";
import { PartEstimates } from "./part-estimates";
import { DocumentsCard } from "./documents-card";

const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);

type Request = NonNullable<Awaited<ReturnType<typeof getRequest>>>;

/** A request once sent to the bureau: its order, quotes, parts' estimates, timeline, documents and messages. */
export async function RequestView({ user, req, sp }: { user: CurrentUser; req: Request; sp: Record<string, string | undefined> }) {
  const db = getDb();
  const units = user.unitsPref;
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
            {order ? <OrderCard order={order} payments={payments} stage={req.stage} canPay={canPay} /> : null}

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

            <PartEstimates requestId={req.id} parts={parts} units={units} cells={catalogue.cells} cureTempC={req.cureTempC} canRevise={canRevise} />
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
            <DocumentsCard issued={issued} documents={documents} parts={parts} />
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
