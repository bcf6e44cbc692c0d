import path from 'node:path';

// The app's own typefaces, shipped with the @fontsource packages, so printed documents look like the screens.
const files = (pkg: string, file: string) => path.join(process.cwd(), 'node_modules', '@fontsource', pkg, 'files', file);

export const DOCUMENT_FONTS = {
  sans: files('atkinson-hyperlegible', 'atkinson-hyperlegible-latin-400-normal.woff'),
  sansBold: files('atkinson-hyperlegible', 'atkinson-hyperlegible-latin-700-normal.woff'),
} as const;

export function registerDocumentFonts(doc: PDFKit.PDFDocument): void {
  doc.registerFont('sans', DOCUMENT_FONTS.sans);
  doc.registerFont('sans-bold', DOCUMENT_FONTS.sansBold);
  // Codes print in the same face: its slashed zero and distinct I/l/1 are made for reading numbers
  // (and the mono web font's subset files trip the PDF font reader).
  doc.registerFont('mono', DOCUMENT_FONTS.sans);
  doc.registerFont('mono-bold', DOCUMENT_FONTS.sansBold);
}

export function pdfBuffer(doc: PDFKit.PDFDocument): Promise<Buffer> {
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  return new Promise((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
}
