import { fileTypeFromBuffer } from 'file-type';

export type Sniffed = { mime: string; label: string } | { mime: null; label: string };

const LABELS: Record<string, string> = {
  'image/jpeg': 'a JPEG image',
  'image/png': 'a PNG image',
  'image/webp': 'a WebP image',
  'image/heic': 'a HEIC photo',
  'image/heif': 'a HEIF photo',
  'application/pdf': 'a PDF document',
  'text/plain': 'plain text',
  'text/csv': 'CSV text',
};

/** Plain text: valid UTF-8 without NUL bytes (a binary file almost always has some). */
export function isPlainText(bytes: Uint8Array): boolean {
  if (bytes.includes(0)) return false;
  try {
    new TextDecoder('utf-8', { fatal: true }).decode(bytes);
    return true;
  } catch {
    return false;
  }
}

/** The real type of a file from its bytes, never from its name. */
export async function sniffType(bytes: Uint8Array, opts: { expectCsv?: boolean } = {}): Promise<Sniffed> {
  const found = await fileTypeFromBuffer(bytes);
  if (found) return { mime: found.mime, label: LABELS[found.mime] ?? `a ${found.ext.toUpperCase()} file` };
  if (isPlainText(bytes)) return opts.expectCsv ? { mime: 'text/csv', label: LABELS['text/csv']! } : { mime: 'text/plain', label: LABELS['text/plain']! };
  return { mime: null, label: 'a file of unknown binary type' };
}

/** What the extension promises, to catch a file whose name lies about its content. */
export const MIME_OF_EXTENSION: Record<string, string[]> = {
  jpg: ['image/jpeg'], jpeg: ['image/jpeg'], png: ['image/png'], webp: ['image/webp'], pdf: ['application/pdf'],
  txt: ['text/plain', 'text/csv'], log: ['text/plain'], csv: ['text/csv', 'text/plain'],
};

export function labelOf(mime: string): string {
  return LABELS[mime] ?? mime;
}
