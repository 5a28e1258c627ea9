import { z } from "zod";
import { PAYMENT_TERMS } from "../../db/schema/organisations";

const id = z.string().min(1).max(64);

/** Accounts sets a firm's terms: prepay, or net 30/45/60 with a credit limit (whole cents, at most $10 M). */
export const firmTermsSchema = z
  .object({
    orgId: id,
    paymentTerms: z.enum(PAYMENT_TERMS, { error: "Pick the firm's terms." }),
    creditLimitCents: z.coerce.number({ error: "Enter the credit limit in dollars." }).int("Whole cents only.").min(0, "The limit can not be negative.").max(1_000_000_000, "At most $10,000,000."),
  })
  .refine((v) => v.paymentTerms === "prepay" || v.creditLimitCents > 0, { path: ["creditLimitCents"], message: "A firm on net terms needs a credit limit above zero." });

/** Accounts records money that arrived outside the payment service (a cheque, a transfer to another account). */
export const manualPaymentSchema = z.object({
  paymentId: id,
  amountCents: z.coerce.number({ error: "Enter the amount received." }).int("Whole cents only.").positive("The amount must be above zero."),
  reference: z.string().trim().min(3, "Enter the bank's or cheque's reference.").max(80, "Use at most 80 characters."),
  note: z.string().trim().max(500).optional().default(""),
  /** The amount again, sent by the form's "are you sure" step. */
  confirmAmountCents: z.coerce.number().int().optional(),
});

/** Accounts settles a transfer that did not apply cleanly: applied by hand to a payment, or returned / explained. */
export const resolveTransferSchema = z.object({
  fundsId: id,
  /** A payment's transfer reference to apply an unmatched arrival to; absent = settle with a note only. */
  applyToReference: z.string().trim().max(40).optional(),
  note: z.string().trim().min(3, "Say what was done with the money.").max(500),
});

/** A client admin's tax-exemption certificate. `expiresOn` is a calendar day (YYYY-MM-DD). */
export const exemptionUploadSchema = z.object({
  certificateNumber: z.string().trim().min(3, "Enter the certificate's number.").max(40, "Use at most 40 characters.").regex(/^[\w ./-]+$/, "Use letters, digits, spaces and . / - _ only."),
  issuedBy: z.string().trim().min(2, "Enter the issuing authority (e.g. the state's revenue department).").max(80),
  expiresOn: z.iso.date("Enter the expiry date."),
  uploadId: id,
});

export const exemptionReviewSchema = z
  .object({
    id,
    decision: z.enum(["approved", "rejected"], { error: "Approve or reject." }),
    note: z.string().trim().max(500).optional().default(""),
  })
  .refine((v) => v.decision === "approved" || v.note.length >= 3, { path: ["note"], message: "Say why it is not accepted; the client sees it." });
