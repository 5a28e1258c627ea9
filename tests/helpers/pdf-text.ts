import { getDocument } from "pdfjs-dist/legacy/build/pdf.mjs";

/**
 * The text of a PDF, page by page, through pdf.js (the npm package `pdfjs-dist`, a
 * general-purpose reader independent of the library that wrote the file). Runs of text are
 * joined with spaces and whitespace is collapsed, so assertions read like the page.
 */
export async function pdfText(bytes: Uint8Array): Promise<{ pages: string[]; text: string; pageCount: number }> {
  const doc = await getDocument({ data: new Uint8Array(bytes), useSystemFonts: false, isEvalSupported: false }).promise;
  const pages: string[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const page = await doc.getPage(i);
    const content = await page.getTextContent();
    pages.push(
      content.items
        .map((it) => ("str" in it ? it.str : ""))
        .join(" ")
        .replace(/\s+/g, " ")
        .trim(),
    );
  }
  await doc.destroy();
  return { pages, text: pages.join("\n"), pageCount: pages.length };
}
