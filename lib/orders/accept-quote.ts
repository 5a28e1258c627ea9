import type { Db } from "@/db/client";
import { getFirmTerms, openOnAccountCents } from "@/db/queries/account-terms";
import { getLatestIssuedVersion, getQuoteWithRequest } from "@/db/queries/client-quotes";
import { getUploadOwned } from "@/db/queries/files";
import { assertCanSee, type CurrentUser } from "@/lib/auth/guard";
import { formatDate } from "@/lib/dates";
import { AppError } from "@/lib/errors";
import { formatCents } from "@/lib/money";
import { checkCredit, isOnAccount } from "@/lib/payments/terms";
import type { AcceptanceContext, ShipToOption } from "./acceptance";

/**
 * The checks before a client accepts a quote, each an AppError the accept form shows (field
 * errors by the form's names): the quote is the latest issued version, unexpired and not stale;
 * the ship-to is the firm's; paying on account is within the firm's terms and credit limit; the
 * purchase order file is the user's PDF.
 */

/** The quote and its request, when this user may accept it now. */
export async function acceptableQuote(db: Db, user: CurrentUser, quoteId: string, now: Date) {
  const row = await getQuoteWithRequest(db, quoteId);
  assertCanSee(user, row ? { orgId: row.request.orgId, createdById: row.request.createdById } : null, "quote");
  const { quote, request } = row!;
  if (quote.status === "accepted") throw new AppError("conflict:quote", "This quote is already accepted.");
  if (quote.status === "superseded") throw new AppError("conflict:quote", "A newer version of this quote replaces it; review the latest version.");
  if (quote.status === "expired" || (quote.validUntil && quote.validUntil.getTime() < now.getTime())) {
    throw new AppError("conflict:quote", `This quote expired${quote.validUntil ? ` on ${formatDate(quote.validUntil)}` : ""}. Ask us for a fresh quote from the messages below.`);
  }
  if (quote.status !== "issued") throw new AppError("conflict:quote", "This quote cannot be accepted.");
  if (quote.isStale) throw new AppError("conflict:quote", "A part's file changed after this quote was made; our sales engineers will re-quote.");
  if ((await getLatestIssuedVersion(db, request.id)) !== quote.version) throw new AppError("conflict:quote", "A newer version of this quote replaces it; review the latest version.");
  if (request.stage !== "quoted") throw new AppError("conflict:stage", "This request is not waiting for a quote to be accepted.");

  return { quote, request };
}

/** The ship-to picked (the firm's default when none is). */
export function pickShipTo(ctx: AcceptanceContext, shipToId: string | undefined): ShipToOption {
  if (ctx.shipTos.length === 0) {
    throw new AppError("conflict:address", "Add a shipping address on your firm's page first: the order needs somewhere to ship, and the freight is priced to it.", { shipToId: ["Your firm has no shipping address yet."] });
  }
  const option = shipToId ? ctx.shipTos.find((o) => o.address.id === shipToId) : (ctx.shipTos.find((o) => o.address.isDefault) ?? ctx.shipTos[0]);
  if (!option) throw new AppError("invalid_input", "Pick one of your firm's shipping addresses.", { shipToId: ["That address is not in your firm's address book."] });
  return option;
}

/** On account: the firm's terms, when it pays on account and this order fits its credit limit. */
export async function onAccountTerms(db: Db, orgId: string, totalCents: number, currency: string) {
  const terms = await getFirmTerms(db, orgId);
  if (!terms || !isOnAccount(terms.paymentTerms)) {
    throw new AppError("conflict:terms", "Your firm does not pay on account yet: pay the deposit by card or bank transfer, or ask the bureau's accounts team for net terms.", { payBy: ["Not available to your firm yet."] });
  }
  const openCents = await openOnAccountCents(db, orgId);
  const credit = checkCredit({ limitCents: terms.creditLimitCents, openCents, orderCents: totalCents });
  if (!credit.ok) {
    const msg = `This order (${formatCents(totalCents, currency)}) would take your firm past its credit limit of ${formatCents(terms.creditLimitCents, currency)}: ${formatCents(openCents, currency)} is open on account, ${formatCents(credit.availableCents, currency)} is left. Pay the deposit by card or bank transfer instead; nothing was accepted.`;
    throw new AppError("conflict:credit_limit", msg, { payBy: [`Over your credit limit by ${formatCents(credit.overByCents, currency)}.`] });
  }
  return terms;
}

/** The purchase order PDF the user uploaded, if any. */
export async function purchaseOrderFile(db: Db, userId: string, uploadId: string | undefined) {
  if (!uploadId) return null;
  const upload = await getUploadOwned(db, uploadId, userId);
  if (!upload) throw new AppError("invalid_input", "That purchase order file was not found; upload it again.", { poUploadId: ["Upload the PDF again."] });
  if (upload.contentType !== "application/pdf" && !/\.pdf$/i.test(upload.fileName)) throw new AppError("invalid_input", "The purchase order must be a PDF.", { poUploadId: ["Upload a PDF."] });
  return upload;
}
