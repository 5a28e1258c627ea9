import { and, eq, ne } from "drizzle-orm";
import { dueDateFor } from "@/lib/payments/terms";
import type { Db } from "@/db/client";
import * as s from "@/db/schema";
import { FIRM_TAX_EXEMPTIONS, FIRM_TERMS, type FirmKey } from "./data";

const DAY = 86_400_000;

/**
 * The demo's procurement state after its orders exist: orders on account that have shipped are
 * invoiced on their firm's terms (dated at shipping, so one is past due), accounts' approvals are
 * named, and a firm holds an approved tax-exemption certificate copied onto its orders.
 */
export async function seedProcurement(db: Db, orgIds: Map<string, string>, now: Date, accountsId: string): Promise<void> {
  for (const key of Object.keys(FIRM_TERMS) as FirmKey[]) {
    await db.update(s.organisations).set({ termsApprovedById: accountsId }).where(eq(s.organisations.id, orgIds.get(key)!));
  }
  const onAccount = await db
    .select({ id: s.orders.id, terms: s.orders.paymentTerms, shippedAt: s.stageEvents.at })
    .from(s.orders)
    .innerJoin(s.stageEvents, and(eq(s.stageEvents.requestId, s.orders.requestId), eq(s.stageEvents.toStage, "shipped")))
    .where(ne(s.orders.paymentTerms, "prepay"));
  for (const o of onAccount) {
    if (o.terms === "prepay") continue;
    const invoicedAt = new Date(o.shippedAt.getTime() + 1);
    await db.update(s.orders).set({ invoicedAt, dueAt: dueDateFor(o.terms, invoicedAt) }).where(eq(s.orders.id, o.id));
  }
  for (const [key, cert] of Object.entries(FIRM_TAX_EXEMPTIONS) as [FirmKey, NonNullable<(typeof FIRM_TAX_EXEMPTIONS)[FirmKey]>][]) {
    const orgId = orgIds.get(key)!;
    const expiresOn = new Date(now.getTime() + cert.validDays * DAY);
    await db.insert(s.taxExemptions).values({ orgId, certificateNumber: cert.certificateNumber, issuedBy: cert.issuedBy, expiresOn, status: "approved", reviewedById: accountsId, reviewedAt: new Date(now.getTime() - 200 * DAY), createdAt: new Date(now.getTime() - 201 * DAY) });
    // Its orders were accepted under the certificate: no tax, and the invoices say why.
    await db.update(s.orders).set({ taxExemption: { certificateNumber: cert.certificateNumber, issuedBy: cert.issuedBy, expiresOn: expiresOn.toISOString() } }).where(eq(s.orders.orgId, orgId));
  }
}
