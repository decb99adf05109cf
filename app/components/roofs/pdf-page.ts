import { getDocument, GlobalWorkerOptions, type PDFDocumentProxy } from "pdfjs-dist";
import workerUrl from "pdfjs-dist/build/pdf.worker.min.mjs?url";
import { UNDERLAY_MAX_BYTES, UNDERLAY_MAX_LABEL } from "~/lib/underlay";

// Loaded on demand, when someone picks a PDF as a plan underlay: the page is drawn here, in the
// browser, and uploaded as a PNG like any other plan image.
GlobalWorkerOptions.workerSrc = workerUrl;

/** Longest side of the drawn page, in pixels: sharp enough to trace, small enough to upload. */
export const PDF_RENDER_SIDE = 3000;

export async function openPdf(file: File): Promise<PDFDocumentProxy> {
  const data = new Uint8Array(await file.arrayBuffer());
  return getDocument({ data, isEvalSupported: false, enableXfa: false }).promise;
}

function toPng(canvas: HTMLCanvasElement): Promise<Blob> {
  return new Promise((resolve, reject) =>
    canvas.toBlob(
      (b) => (b ? resolve(b) : reject(new Error("The page could not be turned into an image."))),
      "image/png",
    ),
  );
}

/**
 * Draws one page (1-based) on white at PDF_RENDER_SIDE pixels along its longer side, smaller if
 * the PNG would pass the upload limit (UNDERLAY_MAX_BYTES), and names it after the file and page.
 */
export async function pageAsPng(pdf: PDFDocumentProxy, fileName: string, pageNumber: number): Promise<File> {
  const page = await pdf.getPage(pageNumber);
  const base = page.getViewport({ scale: 1 });
  let side = PDF_RENDER_SIDE;
  for (let tries = 0; tries < 4; tries++) {
    const viewport = page.getViewport({ scale: side / Math.max(base.width, base.height) });
    const canvas = document.createElement("canvas");
    canvas.width = Math.round(viewport.width);
    canvas.height = Math.round(viewport.height);
    await page.render({ canvas, viewport, background: "#ffffff" }).promise;
    const png = await toPng(canvas);
    if (png.size <= UNDERLAY_MAX_BYTES) {
      const stem = fileName.replace(/\.pdf$/i, "") || "plan";
      return new File([png], `${stem}-page-${pageNumber}.png`, { type: "image/png" });
    }
    side = Math.round(side * 0.7);
  }
  throw new Error(`This page is too detailed to upload as an image under ${UNDERLAY_MAX_LABEL}.`);
}

/** Whether the bytes start like a PDF file (`%PDF-`), whatever the name or type says. */
export async function looksLikePdf(file: File): Promise<boolean> {
  const head = new Uint8Array(await file.slice(0, 5).arrayBuffer());
  return String.fromCharCode(...head) === "%PDF-";
}
