import type { Metadata } from "next";
import { getDb } from "@/db/client";
import { listMembers } from "@/db/queries/members";
import { getOrganisation } from "@/db/queries/organisations";
import { getBureauSettings } from "@/db/queries/retention";
import { BillingForm, InviteForm, RemoveMemberButton } from "@/app/(portal)/portal/(member)/firm/_components/firm-forms";
import { AddressBook } from "@/app/(portal)/portal/(member)/firm/_components/address-book";
import { listAddresses } from "@/db/queries/addresses";
import { getCurrentRateCard } from "@/db/queries/catalogue";
import { zoneFor } from "@/lib/estimating/freight";
import { addressLines } from "@/lib/validation/address";
import { Badge } from "@/components/ui/badge";
import { Card, CardTitle, PageHeader } from "@/components/ui/card";
import { pagePermission } from "@/lib/auth/page-guard";
import { retentionText } from "@/lib/retention/policy";
import { notFound } from "next/navigation";
import { TaxExemptionCard } from "@/app/(portal)/portal/(member)/firm/_components/tax-exemption";
import { listExemptions } from "@/db/queries/tax-exemptions";
import { openOnAccountCents } from "@/db/queries/account-terms";
import { PAYMENT_TERMS_LABEL } from "@/lib/labels";
import { formatCents } from "@/lib/money";
import { formatDate } from "@/lib/dates";

export const metadata: Metadata = { title: "Firm & members" };
export const dynamic = "force-dynamic";

export default async function FirmPage() {
  const user = await pagePermission("members:manage", "/portal/firm");
  if (!user.orgId) notFound();
  const db = getDb();
  const [org, members, settings, addresses, card] = await Promise.all([getOrganisation(db, user.orgId), listMembers(db, user.orgId), getBureauSettings(db), listAddresses(db, user.orgId), getCurrentRateCard(db)]);
  const rules = card?.params.freight ?? null;
  if (!org) notFound();
  const [certs, openCents] = await Promise.all([listExemptions(db, user.orgId), openOnAccountCents(db, user.orgId)]);
  const now = new Date().getTime();
  return (
    <>
      <PageHeader title={org.name} subtitle="Members of your firm, and how the bureau bills you." />
      <div className="space-y-6">
        <Card className="space-y-4">
          <CardTitle>Members</CardTitle>
          <ul className="divide-y divide-paper-200">
            {members.map((m) => (
              <li key={m.id} className="flex flex-wrap items-center gap-x-3 gap-y-1 py-2 text-sm">
                <span className="min-w-0 flex-1">
                  <span className="block font-medium text-ink-800">{m.name ?? m.email}</span>
                  <span className="block text-xs text-ink-500">{m.email}</span>
                </span>
                <Badge tone={m.role === "client_admin" ? "accent" : "neutral"}>{m.role === "client_admin" ? "Lead" : "Engineer"}</Badge>
                {m.disabledAt ? <Badge tone="danger">disabled</Badge> : !m.hasPassword ? <Badge tone="info">invited</Badge> : null}
                <RemoveMemberButton userId={m.id} email={m.email} isSelf={m.id === user.id} />
              </li>
            ))}
          </ul>
          <InviteForm />
        </Card>
        <Card className="space-y-2">
          <CardTitle>Your model files</CardTitle>
          <p className="text-sm text-ink-600">
            The bureau keeps the model files you send for {retentionText(settings.modelRetentionDays)} after an order is closed or
            cancelled, then deletes them from storage. Quotes, invoices, inspection reports and the order&apos;s record stay. On a closed
            order&apos;s page you can have its files deleted sooner.
          </p>
        </Card>
        <Card className="space-y-4" aria-label="Addresses">
          <CardTitle>Addresses</CardTitle>
          <p className="text-sm text-ink-600">
            Estimates price crating and freight to your default ship-to; when you accept a quote you pick where the order ships, and
            the freight is priced for that address.
          </p>
          <AddressBook
            addresses={addresses.map((a) => {
              const zone = a.kind === "shipping" && rules ? zoneFor(rules, a.country, a.region) : null;
              return {
                id: a.id, kind: a.kind, isDefault: a.isDefault, label: a.label, attention: a.attention ?? "", line1: a.line1, line2: a.line2 ?? "", city: a.city,
                region: a.region ?? "", postalCode: a.postalCode, country: a.country, phone: a.phone ?? "", deliveryNotes: a.deliveryNotes ?? "",
                lines: addressLines(a), zoneName: zone?.name ?? null, transitDays: zone?.transitDays ?? null,
              };
            })}
          />
        </Card>
        <Card className="space-y-2" aria-label="Paying on account">
          <CardTitle>Paying on account</CardTitle>
          {org.paymentTerms === "prepay" ? (
            <p className="text-sm text-ink-600">
              Your firm pays a deposit on acceptance and the balance when the order ships, by card or bank transfer. For net terms on
              your purchase orders, ask our accounts team.
            </p>
          ) : (
            <p className="text-sm text-ink-700" data-testid="firm-terms">
              {PAYMENT_TERMS_LABEL[org.paymentTerms]} on your purchase orders, approved {formatDate(org.termsApprovedAt)}: credit limit{" "}
              <strong className="figures">{formatCents(org.creditLimitCents)}</strong>, of which <strong className="figures">{formatCents(openCents)}</strong> is owed on
              open orders and invoices now.
            </p>
          )}
        </Card>
        <Card className="space-y-4" aria-label="Tax exemption">
          <CardTitle>Tax exemption</CardTitle>
          <TaxExemptionCard
            certificates={certs.map(({ e, fileName }) => ({
              id: e.id,
              certificateNumber: e.certificateNumber,
              issuedBy: e.issuedBy,
              expiresOn: formatDate(e.expiresOn),
              state: e.status === "approved" && e.expiresOn.getTime() <= now ? "expired" : e.status,
              reviewNote: e.reviewNote,
              fileUrl: e.uploadId && fileName ? `/api/files/${e.uploadId}?inline=1` : null,
            }))}
          />
        </Card>
        <Card className="space-y-4">
          <CardTitle>Billing</CardTitle>
          <BillingForm initial={{ billingContact: org.billingContact ?? "", billingEmail: org.billingEmail ?? "", defaultPoNumber: org.defaultPoNumber ?? "" }} />
        </Card>
      </div>
    </>
  );
}
