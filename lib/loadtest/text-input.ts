import type { LoadtestIssue } from './issues';
import { MAX_LOADTEST_BYTES } from './limits';

/** A load-test file as uploaded: raw bytes (preferred) or text already decoded. */
export type LoadtestInput = string | Uint8Array | ArrayBuffer;

export type TextResult =
  | { readonly ok: true; readonly text: string; readonly warnings: readonly LoadtestIssue[] }
  | { readonly ok: false; readonly error: LoadtestIssue };

/** How much of the start of a file is checked for binary content. */
const SNIFF_BYTES = 64 * 1024;

const SIGNATURES: ReadonlyArray<{ bytes: readonly number[]; what: string }> = [
  { bytes: [0x50, 0x4b, 0x03, 0x04], what: 'a ZIP archive or an Excel .xlsx workbook' },
  { bytes: [0xd0, 0xcf, 0x11, 0xe0], what: 'an old Excel .xls workbook' },
  { bytes: [0x25, 0x50, 0x44, 0x46], what: 'a PDF document' },
  { bytes: [0x89, 0x50, 0x4e, 0x47], what: 'a PNG image' },
  { bytes: [0xff, 0xd8, 0xff], what: 'a JPEG image' },
  { bytes: [0x1f, 0x8b], what: 'a gzip archive' },
];

const tooLarge = (bytes: number): LoadtestIssue => ({
  code: 'too-large',
  message: `The file is ${(bytes / 1048576).toFixed(1)} MB; the limit is ${MAX_LOADTEST_BYTES / 1048576} MB. Export only the test run, or a lower sample rate.`,
});
const empty: LoadtestIssue = { code: 'empty-file', message: 'The file is empty.' };
const notText = (what: string): LoadtestIssue => ({
  code: 'not-text',
  message: `This is not a CSV text file (it looks like ${what}). Export the run from the tester as CSV.`,
});

function startsWith(bytes: Uint8Array, sig: readonly number[]): boolean {
  if (bytes.length < sig.length) return false;
  for (let i = 0; i < sig.length; i++) if (bytes[i] !== sig[i]) return false;
  return true;
}

/** Control characters other than tab, line feed, form feed and carriage return. */
function isBadControl(code: number): boolean {
  return code < 0x20 && code !== 0x09 && code !== 0x0a && code !== 0x0c && code !== 0x0d;
}

/** More than this share of stray control characters means binary, not text with a glitch. */
const MAX_CONTROL_SHARE = 0.005;

function sniffText(text: string): LoadtestIssue | null {
  const end = Math.min(text.length, SNIFF_BYTES);
  let bad = 0;
  for (let i = 0; i < end; i++) {
    const c = text.charCodeAt(i);
    if (c === 0) return notText('binary data (it contains NUL bytes)');
    if (isBadControl(c)) bad++;
  }
  if (bad > end * MAX_CONTROL_SHARE) return notText('binary data (it contains control bytes)');
  return null;
}

/** Exact UTF-8 length of a string. */
function utf8Length(s: string): number {
  if (!/[^\x00-\x7f]/.test(s)) return s.length;
  let n = 0;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c < 0x80) n += 1;
    else if (c < 0x800) n += 2;
    else if (c >= 0xd800 && c <= 0xdbff) {
      n += 4;
      i++;
    } else n += 3;
  }
  return n;
}

/**
 * Bytes or text → text, refusing files that are too large, empty or binary. Strips a byte-order
 * mark; reads UTF-16 when it carries one; falls back to Windows-1252 (with a warning) when the bytes
 * are not valid UTF-8, as older spreadsheet exports are.
 */
export function readLoadtestText(input: LoadtestInput): TextResult {
  if (typeof input === 'string') {
    if (input.length > MAX_LOADTEST_BYTES || (input.length * 3 > MAX_LOADTEST_BYTES && utf8Length(input) > MAX_LOADTEST_BYTES)) {
      return { ok: false, error: tooLarge(utf8Length(input)) };
    }
    const text = input.charCodeAt(0) === 0xfeff ? input.slice(1) : input;
    if (!/\S/.test(text)) return { ok: false, error: empty };
    const bad = sniffText(text);
    return bad ? { ok: false, error: bad } : { ok: true, text, warnings: [] };
  }

  const bytes = input instanceof Uint8Array ? input : new Uint8Array(input);
  if (bytes.byteLength > MAX_LOADTEST_BYTES) return { ok: false, error: tooLarge(bytes.byteLength) };
  if (bytes.byteLength === 0) return { ok: false, error: empty };

  for (const sig of SIGNATURES) if (startsWith(bytes, sig.bytes)) return { ok: false, error: notText(sig.what) };

  let text: string;
  const warnings: LoadtestIssue[] = [];
  if (startsWith(bytes, [0xff, 0xfe]) || startsWith(bytes, [0xfe, 0xff])) {
    text = new TextDecoder(bytes[0] === 0xff ? 'utf-16le' : 'utf-16be').decode(bytes);
  } else {
    const end = Math.min(bytes.length, SNIFF_BYTES);
    let bad = 0;
    for (let i = 0; i < end; i++) {
      const b = bytes[i] as number;
      if (b === 0) return { ok: false, error: notText('binary data (it contains NUL bytes)') };
      if (isBadControl(b)) bad++;
    }
    if (bad > end * MAX_CONTROL_SHARE) return { ok: false, error: notText('binary data (it contains control bytes)') };
    try {
      text = new TextDecoder('utf-8', { fatal: true, ignoreBOM: false }).decode(bytes);
    } catch {
      text = new TextDecoder('windows-1252').decode(bytes);
      warnings.push({
        code: 'not-utf8',
        message: 'The file is not UTF-8 text; it was read as Windows-1252 (Western European). Check that the column names read correctly.',
      });
    }
  }
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  if (!/\S/.test(text)) return { ok: false, error: empty };
  const bad = sniffText(text);
  return bad ? { ok: false, error: bad } : { ok: true, text, warnings };
}
