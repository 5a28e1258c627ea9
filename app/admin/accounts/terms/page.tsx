import type { Metadata } from "next";
import { Badge } from "@/components/ui/badge";
import { ButtonLink } from "@/components/ui/button";
import { Card, CardTitle, EmptyState, PageHeader } from "@/components/ui/card";
import { getDb } from "@/db/client";
import { listFirmAccounts, listTermsInvoices } from "@/db/queries/account-terms";
import { listAllExemptions } from "@/db/queries/tax-exemptions";
import { pagePermission } from "@/lib/auth/page-guard";
import { formatDate } from "@/lib/dates";
import { EXEMPTION_STATE_LABEL, EXEMPTION_STATE_TONE, INVOICE_STANDING_LABEL, INVOICE_STANDING_TONE, PAYMENT_TERMS_LABEL } from "@/lib/labels";
import { formatCents } from "@/lib/money";
import { daysOverdue, invoiceStanding } from "@/lib/payments/terms";
import { ReviewForm, TermsForm } from "./_components/terms-forms";

export const metadata: Metadata = { title: "Terms and credit" };
export const dynamic = "force-dynamic";

/** Accounts: invoices on net terms (overdue first), each firm's terms and credit, tax-exemption certificates. */
export default async function TermsPage() {
  await pagePermission("accounts:terms", "/admin/accounts/terms");
  const db = getDb();
  const now = new Date();
  const [firms, invoices, certs] = await Promise.all([listFirmAccounts(db), listTermsInvoices(db), listAllExemptions(db)]);
  const rows = invoices
    .map((i) => ({ ...i, standing: invoiceStanding({ dueAt: i.dueAt, isPaid: i.isPaid, now }) }))
    .sort((a, b) => Number(b.standing === "overdue") - Number(a.standing === "overdue"));
  const overdue = rows.filter((r) => r.standing === "overdue");
  return (
    <>
      <PageHeader
        title="Terms and credit"
        subtitle="Invoices on net terms, each firm's terms and credit limit, and tax-exemption certificates."
        actions={<ButtonLink href="/admin/accounts/transfers" variant="secondary">Bank transfers</ButtonLink>}
      />
      <div className="space-y-6">
        <Card className="space-y-3" aria-labelledby="inv-title">
          <CardTitle id="inv-title">Invoices on account</CardTitle>
          {overdue.length ? (
            <p className="rounded bg-red-50 px-3 py-2 text-sm text-red-900" role="status">
              {overdue.length} overdue, {formatCents(overdue.reduce((s, r) => s + r.owedCents, 0))} in all.
            </p>
          ) : null}
          {rows.length === 0 ? (
            <EmptyState title="No invoices on account">An order accepted on net terms is invoiced when it ships.</EmptyState>
          ) : (
            <div className="overflow-x-auto" tabIndex={0} role="region" aria-label="Invoices on account">
              <table className="w-full min-w-[44rem] text-left text-sm">
                <thead className="text-xs text-ink-500">
                  <tr>
                    <th className="py-1 pr-3">Invoice</th>
                    <th className="py-1 pr-3">Firm</th>
                    <th className="py-1 pr-3">Order · PO</th>
                    <th className="py-1 pr-3">Terms</th>
                    <th className="py-1 pr-3">Due</th>
                    <th className="py-1 pr-3 text-right">Owed</th>
                    <th className="py-1">State</th>
                  </tr>
                </thead>
                <tbody className="divide-y divide-paper-200">
                  {rows.map((r) => (
                    <tr key={r.orderId}>
                      <td className="whitespace-nowrap py-2 pr-3 font-medium">{r.invoiceNumber ?? "—"}</td>
                      <td className="py-2 pr-3">{r.firm}</td>
                      <td className="py-2 pr-3">
                        {r.reference} · {r.poNumber}
                      </td>
                      <td className="py-2 pr-3">{PAYMENT_TERMS_LABEL[r.paymentTerms]}</td>
                      <td className="py-2 pr-3">{formatDate(r.dueAt)}</td>
                      <td className="figures py-2 pr-3 text-right">{formatCents(r.owedCents, r.currency)}</td>
                      <td className="py-2">
                        <Badge tone={INVOICE_STANDING_TONE[r.standing]}>
                          {INVOICE_STANDING_LABEL[r.standing]}
                          {r.standing === "overdue" && r.dueAt ? `, ${daysOverdue(r.dueAt, now)} d` : ""}
                        </Badge>
                        {r.reminderSentAt ? <span className="ml-2 text-xs text-ink-500">reminded {formatDate(r.reminderSentAt)}</span> : null}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
        </Card>

        <Card className="space-y-4" aria-labelledby="firms-title">
          <CardTitle id="firms-title">Firms&apos; terms</CardTitle>
          <p className="text-sm text-ink-600">
            A firm on net terms accepts quotes on its purchase order without a deposit, up to its credit limit (what it owes on
            account plus the new order). Past the limit it pays by card or bank transfer.
          </p>
          <ul className="divide-y divide-paper-200">
            {firms.map((f) => (
              <li key={f.id} className="space-y-2 py-3">
                <div className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
                  <h3 className="font-semibold text-ink-800">{f.name}</h3>
                  <Badge tone={f.paymentTerms === "prepay" ? "neutral" : "info"}>{PAYMENT_TERMS_LABEL[f.paymentTerms]}</Badge>
                  {f.paymentTerms !== "prepay" ? (
                    <span className="figures text-sm text-ink-600">
                      {formatCents(f.openCents)} owed on account of {formatCents(f.creditLimitCents)}
                      {f.termsApprovedAt ? ` · approved ${formatDate(f.termsApprovedAt)}` : ""}
                    </span>
                  ) : null}
                </div>
                <TermsForm orgId={f.id} firm={f.name} terms={f.paymentTerms} limitCents={f.creditLimitCents} />
              </li>
            ))}
          </ul>
        </Card>

        <Card className="space-y-3" aria-labelledby="tax-title">
          <CardTitle id="tax-title">Tax-exemption certificates</CardTitle>
          {certs.length === 0 ? <EmptyState title="No certificates">A client firm&apos;s lead sends one from the firm&apos;s page.</EmptyState> : null}
          <ul className="divide-y divide-paper-200">
            {certs.map(({ e, firm, fileName }) => {
              const isExpired = e.expiresOn.getTime() <= now.getTime();
              const state = e.status === "approved" && isExpired ? "expired" : e.status;
              return (
                <li key={e.id} className="grid gap-3 py-3 sm:grid-cols-[1fr_20rem]">
                  <div className="space-y-1 text-sm">
                    <div className="flex flex-wrap items-baseline gap-2">
                      <span className="font-semibold text-ink-800">{firm}</span>
                      <Badge tone={EXEMPTION_STATE_TONE[state]}>{EXEMPTION_STATE_LABEL[state]}</Badge>
                      {e.status === "pending" && isExpired ? <Badge tone="warn">expired</Badge> : null}
                    </div>
                    <p>
                      Certificate {e.certificateNumber}, issued by {e.issuedBy}, valid until {formatDate(e.expiresOn)}
                    </p>
                    {e.uploadId ? (
                      <a className="text-kiln-700 underline" href={`/api/files/${e.uploadId}?inline=1`}>
                        {fileName ?? "Certificate PDF"}
                      </a>
                    ) : null}
                    {e.reviewNote ? <p className="text-ink-600">Note: {e.reviewNote}</p> : null}
                  </div>
                  {e.status === "pending" ? <ReviewForm id={e.id} number={e.certificateNumber} isExpired={isExpired} /> : null}
                </li>
              );
            })}
          </ul>
        </Card>
      </div>
    </>
  );
}
