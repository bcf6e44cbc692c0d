// A small Code 128 reader for tests, written independently of the encoder the app uses, so a
// packing slip's barcode is checked by reading its bars, not by asking the encoder again.
//
// Symbol patterns: bar/space widths in modules for values 0–106 (ISO/IEC 15417, the symbol
// character table; typed in from memory, so the test also checks the table's structure: every
// symbol is 11 modules with an even number of bar modules, the stop 13, and all 107 differ).

export const CODE128_PATTERNS = [
  '212222', '222122', '222221', '121223', '121322', '131222', '122213', '122312', '132212', '221213',
  '221312', '231212', '112232', '122132', '122231', '113222', '123122', '123221', '223211', '221132',
  '221231', '213212', '223112', '312131', '311222', '321122', '321221', '312212', '322112', '322211',
  '212123', '212321', '232121', '111323', '131123', '131321', '112313', '132113', '132311', '211313',
  '231113', '231311', '112133', '112331', '132131', '113123', '113321', '133121', '313121', '211331',
  '231131', '213113', '213311', '213131', '311123', '311321', '331121', '312113', '312311', '332111',
  '314111', '221411', '431111', '111224', '111422', '121124', '121421', '141122', '141221', '112214',
  '112412', '122114', '122411', '142112', '142211', '241211', '221114', '413111', '241112', '134111',
  '111242', '121142', '121241', '114212', '124112', '124211', '411212', '421112', '421211', '212141',
  '214121', '412121', '111143', '111341', '131141', '114113', '114311', '411113', '411311', '113141',
  '114131', '311141', '411131', '211412', '211214', '211232', '2331112',
] as const;

const START_A = 103;
const START_B = 104;
const START_C = 105;
const STOP = 106;

const VALUE_OF = new Map<string, number>(CODE128_PATTERNS.map((p, i) => [p, i]));

export type Code128Result = { text: string; values: number[] };

/** Decodes run lengths (alternating dark, light, dark… starting with the first bar). */
export function decodeCode128Runs(runs: number[]): Code128Result {
  // The start symbol is 11 modules over its 6 elements; that gives the module width.
  const startPx = runs.slice(0, 6).reduce((a, b) => a + b, 0);
  const module = startPx / 11;
  const widths = runs.map((r) => Math.round(r / module));
  if (widths.some((w) => w < 1 || w > 4)) throw new Error(`bars of ${widths.join(',')} modules: not a clean Code 128 symbol`);
  const values: number[] = [];
  let i = 0;
  for (;;) {
    const isStop = widths.length - i === 7;
    const n = isStop ? 7 : 6;
    if (widths.length - i < n) throw new Error('the symbol ends before its stop pattern');
    const key = widths.slice(i, i + n).join('');
    const v = VALUE_OF.get(key);
    if (v === undefined) throw new Error(`unknown pattern ${key} at element ${i}`);
    values.push(v);
    i += n;
    if (v === STOP) break;
  }
  if (i !== widths.length) throw new Error('bars after the stop pattern');
  const [start, ...rest] = values;
  const data = rest.slice(0, -2);
  const check = rest[rest.length - 2];
  if (start === undefined || check === undefined) throw new Error('too short for a Code 128 symbol');
  const sum = data.reduce((acc, v, k) => acc + v * (k + 1), start);
  if (sum % 103 !== check) throw new Error(`check symbol ${check} does not match ${sum % 103}`);
  return { text: interpret(start, data), values };
}

function interpret(start: number, data: number[]): string {
  let set: 'A' | 'B' | 'C' = start === START_A ? 'A' : start === START_B ? 'B' : start === START_C ? 'C' : (() => {
    throw new Error(`symbol does not begin with a start character (got ${start})`);
  })();
  let out = '';
  let shift = false;
  for (const v of data) {
    const current = shift ? (set === 'A' ? 'B' : 'A') : set;
    shift = false;
    if (current === 'C') {
      if (v < 100) out += String(v).padStart(2, '0');
      else if (v === 100) set = 'B';
      else if (v === 101) set = 'A';
      else if (v !== 102) throw new Error(`value ${v} has no meaning in code set C`);
      continue;
    }
    if (v < 64) out += String.fromCharCode(v + 32);
    else if (v < 96) out += String.fromCharCode(current === 'A' ? v - 64 : v + 32);
    else if (v === 98) shift = true;
    else if (v === 99) set = 'C';
    else if (v === 100) set = current === 'A' ? 'B' : set; // in B: FNC4, ignored
    else if (v === 101) set = current === 'B' ? 'A' : set; // in A: FNC4, ignored
    // 96, 97, 102: FNC3, FNC2, FNC1 carry no text
  }
  return out;
}

/** Reads one row of RGBA pixels: dark (< 128 luminance) and light runs, quiet zones cut off. */
export function runsOfRow(rgba: Uint8Array | Buffer, width: number, row: number, channels = 4): number[] {
  const dark: boolean[] = [];
  for (let x = 0; x < width; x++) {
    const o = (row * width + x) * channels;
    const lum = 0.299 * rgba[o]! + 0.587 * rgba[o + 1]! + 0.114 * rgba[o + 2]!;
    dark.push(lum < 128);
  }
  const first = dark.indexOf(true);
  const last = dark.lastIndexOf(true);
  if (first < 0) throw new Error('no bars in this row');
  const runs: number[] = [];
  let len = 1;
  for (let x = first + 1; x <= last; x++) {
    if (dark[x] === dark[x - 1]) len++;
    else {
      runs.push(len);
      len = 1;
    }
  }
  runs.push(len);
  return runs;
}

/** Decodes the middle row of an image's pixels. */
export function decodeCode128Image(rgba: Uint8Array | Buffer, width: number, height: number, channels = 4): Code128Result {
  return decodeCode128Runs(runsOfRow(rgba, width, Math.floor(height / 2), channels));
}
