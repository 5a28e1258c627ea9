import { renderToBuffer } from "@react-pdf/renderer";
import { createHash } from "node:crypto";
import { createElement } from "react";
import { IssuedDocumentPdf } from "./pdf";
import { registerFonts } from "./pdf-theme";
import type { DocumentData } from "./types";

/** Render a document's snapshot to PDF bytes, with the SHA-256 stored beside them. */
export async function renderDocumentPdf(data: DocumentData): Promise<{ pdf: Buffer; sha256: string }> {
  registerFonts();
  const pdf = await renderToBuffer(createElement(IssuedDocumentPdf, { data }) as Parameters<typeof renderToBuffer>[0]);
  return { pdf, sha256: createHash("sha256").update(pdf).digest("hex") };
}
