import type { Db } from "../../db/client";
import type { Tx } from "../../db/queries/audit";
import { writeAudit } from "../../db/queries/audit";
import { getIssuedDocument, getIssuedDocumentBySource, insertIssuedDocument, storeDocumentPdf } from "../../db/queries/issued-documents";
import type { IssuedDocumentKind } from "../../db/schema/issued-documents";
import { buildBalanceInvoiceData, buildCreditNoteData, buildDepositInvoiceData, buildPackingListData, buildQuoteData } from "./build";
import { renderDocumentPdf } from "./render";
import type { DocumentData } from "./types";

/** What a document stands for: the quote, deposit payment, order (balance, packing) or refund. */
export interface IssueRequest {
  kind: IssuedDocumentKind;
  sourceId: string;
  actorId?: string | null;
  now?: Date;
}

async function build(q: Db | Tx, r: IssueRequest, now: Date): Promise<DocumentData> {
  switch (r.kind) {
    case "quote":
      return buildQuoteData(q, r.sourceId, now);
    case "deposit_invoice":
      return buildDepositInvoiceData(q, r.sourceId, now);
    case "invoice":
      return buildBalanceInvoiceData(q, r.sourceId, now);
    case "credit_note":
      return buildCreditNoteData(q, r.sourceId, now);
    case "packing_list":
      return buildPackingListData(q, r.sourceId, now);
  }
}

/**
 * Issue a document inside the caller's transaction: its snapshot is read from the same
 * transaction and its number taken from its series there, so the document exists exactly when
 * the event it records (a quote issued, a payment recorded…) commits. Idempotent per
 * (kind, source). The PDF is rendered after commit by `ensureDocumentPdf`.
 */
export async function issueDocumentInTx(tx: Tx, r: IssueRequest): Promise<{ id: string; number: string; isNew: boolean }> {
  const existing = await getIssuedDocumentBySource(tx, r.kind, r.sourceId);
  if (existing) return { id: existing.id, number: existing.number, isNew: false };
  const now = r.now ?? new Date();
  const data = await build(tx, r, now);
  const { requestId, orgId } = data;
  const doc = await insertIssuedDocument(tx, { kind: r.kind, sourceId: r.sourceId, requestId, orgId, data: data as unknown as Record<string, unknown>, issuedAt: new Date(data.issuedAt), issuedById: r.actorId ?? null });
  if (doc.isNew) await writeAudit(tx, { actorId: r.actorId ?? null, action: "document.issue", entityType: "issued_document", entityId: doc.id, orgId, after: { kind: r.kind, number: doc.number, sourceId: r.sourceId } });
  return doc;
}

/** Render and store a document's PDF if it has none yet; returns the stored bytes. */
export async function ensureDocumentPdf(db: Db, id: string): Promise<Buffer> {
  const row = await getIssuedDocument(db, id);
  if (!row) throw new Error(`documents: ${id} not found`);
  if (row.doc.pdf) return row.doc.pdf;
  const { pdf, sha256 } = await renderDocumentPdf(row.doc.data as unknown as DocumentData);
  if (await storeDocumentPdf(db, id, pdf, sha256)) return pdf;
  // Another process stored it first: serve theirs, so every copy sent is the same bytes.
  const again = await getIssuedDocument(db, id);
  return again!.doc.pdf!;
}

/** Issue in its own transaction, then render: for callers with no transaction of their own. */
export async function issueDocument(db: Db, r: IssueRequest): Promise<{ id: string; number: string; isNew: boolean; pdf: Buffer }> {
  const doc = await db.transaction((tx) => issueDocumentInTx(tx, r));
  return { ...doc, pdf: await ensureDocumentPdf(db, doc.id) };
}
