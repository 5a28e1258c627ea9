import type { listDocuments } from "@/db/queries/documents";
import type { listIssuedDocuments } from "@/db/queries/issued-documents";
import type { listPartsWithAnalysis } from "@/db/queries/parts";
import { IssuedDocumentsList } from "@/components/issued-documents";
import { Badge } from "@/components/ui/badge";
import { Card, CardTitle } from "@/components/ui/card";
import { DOCUMENT_KIND_LABEL } from "@/lib/labels";

type IssuedDoc = Awaited<ReturnType<typeof listIssuedDocuments>>[number];
type Attachment = Awaited<ReturnType<typeof listDocuments>>[number];
type PartRow = Awaited<ReturnType<typeof listPartsWithAnalysis>>[number];

/** The request's issued documents, its reports and attachments, and the client's own files. */
export function DocumentsCard({ issued, documents, parts }: { issued: IssuedDoc[]; documents: Attachment[]; parts: PartRow[] }) {
  return (
    <Card>
    <CardTitle className="mb-3">Documents</CardTitle>
    <IssuedDocumentsList docs={issued} empty="Quotations, invoices, credit notes and the packing list appear here as PDFs once issued." />
    {documents.filter((d) => !d.messageId).length > 0 ? (
      <div className="mt-4 border-t border-paper-200 pt-3">
        <p className="text-xs font-medium uppercase tracking-wide text-ink-500">Reports and attachments</p>
        <ul className="mt-1 space-y-2 text-sm">
          {documents
            .filter((d) => !d.messageId)
            .map((d) => (
              <li key={d.id} className="flex items-center gap-2">
                <Badge>{DOCUMENT_KIND_LABEL[d.kind] ?? d.kind}</Badge>
                {d.hasFile ? (
                  <a href={`/api/files/${d.id}`} className="text-kiln-700 underline">
                    {d.title}
                  </a>
                ) : (
                  <span>{d.title}</span>
                )}
              </li>
            ))}
        </ul>
      </div>
    ) : null}
    {parts.some((p) => p.revision) ? (
      <div className="mt-4 border-t border-paper-200 pt-3">
        <p className="text-xs font-medium uppercase tracking-wide text-ink-500">Your files</p>
        <ul className="mt-1 space-y-1 text-sm">
          {parts.map((p) =>
            p.revision ? (
              <li key={p.part.id}>
                <a href={`/api/files/${p.revision.id}`} className="text-kiln-700 underline">
                  {p.revision.fileName}
                </a>{" "}
                <span className="text-xs text-ink-400">rev {p.revision.revision}</span>
              </li>
            ) : null,
          )}
        </ul>
      </div>
    ) : null}
  </Card>
  );
}
