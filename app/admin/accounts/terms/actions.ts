"use server";

import { revalidatePath } from "next/cache";
import { writeAudit } from "@/db/queries/audit";
import { getFirmTerms, setFirmTerms } from "@/db/queries/account-terms";
import { getExemption, reviewExemption } from "@/db/queries/tax-exemptions";
import { AppError } from "@/lib/errors";
import { defineAction } from "@/lib/server/define-action";
import { exemptionReviewSchema, firmTermsSchema } from "@/lib/validation/account-terms";

/** Accounts approves a firm for net terms with a credit limit, or puts it back on deposit and balance. */
export const setTerms = defineAction({ access: "accounts:terms", input: firmTermsSchema }, async (input, { user, db }) => {
  const before = await getFirmTerms(db, input.orgId);
  if (!before) throw new AppError("not_found:firm", "That firm was not found.");
  const now = new Date();
  await db.transaction(async (tx) => {
    await setFirmTerms(tx, { orgId: input.orgId, paymentTerms: input.paymentTerms, creditLimitCents: input.creditLimitCents, approvedById: user.id, now });
    await writeAudit(tx, {
      actorId: user.id, action: "org.terms", entityType: "organisation", entityId: input.orgId, orgId: input.orgId,
      before: { paymentTerms: before.paymentTerms, creditLimitCents: before.creditLimitCents },
      after: { paymentTerms: input.paymentTerms, creditLimitCents: input.paymentTerms === "prepay" ? 0 : input.creditLimitCents },
    });
  });
  revalidatePath("/admin/accounts/terms");
  return { paymentTerms: input.paymentTerms };
});

/** Accounts approves or rejects a firm's tax-exemption certificate; an expired one can not be approved. */
export const reviewTaxExemption = defineAction({ access: "accounts:terms", input: exemptionReviewSchema }, async (input, { user, db }) => {
  const cert = await getExemption(db, input.id);
  if (!cert) throw new AppError("not_found:certificate", "That certificate was not found.");
  const now = new Date();
  if (input.decision === "approved" && cert.expiresOn.getTime() <= now.getTime()) {
    throw new AppError("conflict:expired", "This certificate has expired; it can not be approved. Reject it and ask the firm for a current one.");
  }
  const done = await db.transaction(async (tx) => {
    const ok = await reviewExemption(tx, { id: cert.id, status: input.decision, note: input.note || null, reviewerId: user.id, now });
    if (ok) await writeAudit(tx, { actorId: user.id, action: "tax_exemption.review", entityType: "tax_exemption", entityId: cert.id, orgId: cert.orgId, after: { decision: input.decision, certificateNumber: cert.certificateNumber, note: input.note || null } });
    return ok;
  });
  if (!done) throw new AppError("conflict:reviewed", "This certificate was already reviewed.");
  revalidatePath("/admin/accounts/terms");
  return { status: input.decision };
});
