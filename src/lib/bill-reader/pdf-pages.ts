// A PDF's text layer as positioned pieces, page by page, for the bill reader. Shared by the
// server (uploads) and the read-bill command; never imported by browser code.
import { pageLines, type BillPage } from "./layout";

/** At most this many pages are read: bills are a few pages; a long document is not a bill (our choice). */
const MAX_BILL_PAGES = 12;

export async function pdfPages(bytes: Uint8Array): Promise<BillPage[]> {
  const { getDocumentProxy } = await import("unpdf");
  // unpdf empties the buffer it is given, so it gets a copy.
  const pdf = await getDocumentProxy(new Uint8Array(bytes));
  const pages: BillPage[] = [];
  for (let n = 1; n <= Math.min(pdf.numPages, MAX_BILL_PAGES); n++) {
    const page = await pdf.getPage(n);
    const content = await page.getTextContent();
    const items: BillPage["items"] = [];
    for (const it of content.items) {
      if (!("str" in it) || it.str.trim() === "") continue;
      const [a, b, , d, x, y] = it.transform as number[];
      items.push({
        str: it.str,
        x,
        y,
        w: it.width,
        h: it.height || Math.hypot(a, b) || Math.abs(d),
      });
    }
    pages.push({ items });
  }
  return pages;
}

/** The pages' text, line by line (what is kept with the upload for search and review). */
export function pagesText(pages: BillPage[]): string {
  return pages
    .map((p, i) =>
      pageLines(p, i + 1)
        .map((l) => l.text)
        .join("\n"),
    )
    .join("\n\f\n");
}
