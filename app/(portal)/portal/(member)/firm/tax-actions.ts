"use server";

import { revalidatePath } from "next/cache";
import { writeAudit } from "@/db/queries/audit";
import { getUploadOwned } from "@/db/queries/files";
import { createExemption } from "@/db/queries/tax-exemptions";
import { AppError } from "@/lib/errors";
import { defineAction } from "@/lib/server/define-action";
import { exemptionUploadSchema } from "@/lib/validation/account-terms";

/**
 * A client admin sends the firm's tax-exemption certificate (number, issuing authority, expiry,
 * the PDF). It waits for accounts; an expired one is refused here and nothing is stored.
 */
export const submitTaxExemption = defineAction({ access: "billing:manage", input: exemptionUploadSchema }, async (input, { user, db }) => {
  if (!user.orgId) throw new AppError("forbidden", "Your account is not part of a client firm.");
  // The certificate is valid through its expiry day (UTC end of day).
  const expiresOn = new Date(`${input.expiresOn}T23:59:59.999Z`);
  if (expiresOn.getTime() <= Date.now()) {
    throw new AppError("invalid_input", "This certificate has already expired; send a current one.", { expiresOn: ["The expiry date has passed."] });
  }
  const upload = await getUploadOwned(db, input.uploadId, user.id);
  if (!upload) throw new AppError("invalid_input", "The certificate file was not found; upload it again.", { uploadId: ["Upload the PDF again."] });
  if (upload.contentType !== "application/pdf" && !/\.pdf$/i.test(upload.fileName)) throw new AppError("invalid_input", "The certificate must be a PDF.", { uploadId: ["Upload a PDF."] });
  const row = await db.transaction(async (tx) => {
    const e = await createExemption(tx, { orgId: user.orgId!, certificateNumber: input.certificateNumber, issuedBy: input.issuedBy, expiresOn, uploadId: upload.id, uploadedById: user.id });
    await writeAudit(tx, { actorId: user.id, action: "tax_exemption.upload", entityType: "tax_exemption", entityId: e.id, orgId: user.orgId, after: { certificateNumber: input.certificateNumber, issuedBy: input.issuedBy, expiresOn: input.expiresOn, fileName: upload.fileName } });
    return e;
  });
  revalidatePath("/portal/firm");
  return { id: row.id };
});
