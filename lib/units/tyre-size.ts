import { INCH_M } from './constants';

/** A tyre by its ISO 5775 designation, e.g. 57-622: section width 57 mm on a 622 mm bead seat. */
export interface TyreSize {
  readonly widthMm: number;
  readonly bsdMm: number;
  /** Canonical designation "width-BSD". */
  readonly iso: string;
  /** The text the user typed when it was an inch or French size that we converted. */
  readonly convertedFrom?: string;
}

export type TyreSizeResult =
  | { readonly ok: true; readonly tyre: TyreSize; readonly note?: string }
  | { readonly ok: false; readonly message: string };

/** Plausible bounds for bicycle tyres, from 16 mm road tubulars to 5-inch fat-bike tyres on 100–700 mm bead seats. */
const WIDTH_RANGE_MM = [16, 130] as const;
const BSD_RANGE_MM = [100, 700] as const;

/**
 * Bead seat diameters for decimal-width inch sizes and French sizes (ISO 5775; the reference
 * table in reference-values.md). Fractional inch sizes ("26 x 1 3/8") are left out on purpose:
 * the same nominal diameter maps to different bead seats there.
 */
const DECIMAL_INCH_BSD: Readonly<Record<string, number>> = { '29': 622, '28': 622, '27.5': 584, '26': 559, '24': 507, '20': 406 };
const FRENCH_BSD: Readonly<Record<string, number>> = { '700c': 622, '650b': 584 };

const ISO_RE = /^(?:(?:iso|etrto)\s*:?\s*)?(\d{2,3})\s*[-–]\s*(\d{3})$/i;
const DECIMAL_INCH_RE = /^(\d{2}(?:\.\d)?)\s*(?:"|''|in(?:ch(?:es)?)?)?\s*[x×*]\s*(\d(?:\.\d{1,3})?)\s*(?:"|''|in(?:ch(?:es)?)?)?$/i;
const FRENCH_RE = /^(\d{3})\s*([a-c])?\s*[x×*]\s*(\d{2})\s*([a-c])?$/i;

function fromParts(widthMm: number, bsdMm: number, convertedFrom?: string): TyreSizeResult {
  if (widthMm < WIDTH_RANGE_MM[0] || widthMm > WIDTH_RANGE_MM[1]) {
    return { ok: false, message: `Tyre width ${widthMm} mm is outside ${WIDTH_RANGE_MM[0]}–${WIDTH_RANGE_MM[1]} mm; check the size on the sidewall (e.g. 57-622).` };
  }
  if (bsdMm < BSD_RANGE_MM[0] || bsdMm > BSD_RANGE_MM[1]) {
    return { ok: false, message: `Bead seat diameter ${bsdMm} mm is outside ${BSD_RANGE_MM[0]}–${BSD_RANGE_MM[1]} mm; the ISO size is width first, then bead seat (e.g. 57-622).` };
  }
  const tyre: TyreSize = { widthMm, bsdMm, iso: `${widthMm}-${bsdMm}`, ...(convertedFrom ? { convertedFrom } : {}) };
  return { ok: true, tyre };
}

/**
 * Parse a tyre size. Accepts the ISO 5775 designation ("57-622", also "ETRTO 57-622"), decimal-width
 * inch sizes on the diameters we can map soundly ("29 x 2.25", "27.5 x 2.4", "26 x 2.10", "24 x 1.95",
 * "20 x 4.0") and French sizes 700C and 650B ("700 x 35C", "650B x 47"). Anything else is refused
 * with a message saying what to enter instead.
 */
export function parseTyreSize(input: string): TyreSizeResult {
  const text = input.trim().replace(/\s+/g, ' ');
  if (text === '') return { ok: false, message: 'Enter the tyre size printed on the sidewall, e.g. 57-622.' };

  const iso = ISO_RE.exec(text);
  if (iso) {
    const a = Number(iso[1]);
    const b = Number(iso[2]);
    if (a > b) return { ok: false, message: `"${text}" reads as width ${a} mm on a ${b} mm bead seat; the ISO size puts the width first, e.g. 57-622.` };
    return fromParts(a, b);
  }

  if (/\d\s+\d+\/\d+|\d\/\d/.test(text)) {
    return {
      ok: false,
      message: `"${text}" is a fractional inch size; these map to different bead seats for the same nominal diameter. Enter the ISO size from the sidewall (e.g. 37-590), or a measured roll-out.`,
    };
  }

  const inch = DECIMAL_INCH_RE.exec(text);
  if (inch) {
    const diameter = String(Number(inch[1]));
    const widthText = inch[2] ?? '';
    const bsd = DECIMAL_INCH_BSD[diameter];
    if (bsd === undefined) {
      return { ok: false, message: `"${text}": a ${diameter}-inch size is not one we map (29, 28, 27.5, 26, 24, 20). Enter the ISO size from the sidewall, e.g. 57-622.` };
    }
    if (!widthText.includes('.')) {
      return { ok: false, message: `"${text}": write the width with its decimals as printed (e.g. ${diameter} x ${widthText}.00), or enter the ISO size from the sidewall.` };
    }
    const widthMm = Math.round((Number(widthText) * INCH_M) / 0.001);
    const r = fromParts(widthMm, bsd, text);
    if (!r.ok) return r;
    return {
      ...r,
      note: `Converted from ${text}: ${diameter}-inch decimal sizes sit on a ${bsd} mm bead seat; ${widthText} in ≈ ${widthMm} mm. Makers mark the same inch width a few mm apart, so prefer the ISO size on the sidewall or a measured roll-out.`,
    };
  }

  const french = FRENCH_RE.exec(text);
  if (french) {
    const letter = (french[2] ?? french[4] ?? '').toLowerCase();
    const key = `${french[1]}${letter}`;
    const bsd = FRENCH_BSD[key];
    if (bsd === undefined) {
      return { ok: false, message: `"${text}": only 700C and 650B French sizes are mapped; enter the ISO size from the sidewall, e.g. 35-622.` };
    }
    const widthMm = Number(french[3]);
    const r = fromParts(widthMm, bsd, text);
    if (!r.ok) return r;
    return { ...r, note: `Converted from ${text}: ${key.toUpperCase()} is a ${bsd} mm bead seat.` };
  }

  return { ok: false, message: `"${text}" is not a tyre size we can read. Enter the ISO 5775 size from the sidewall: width-bead seat in mm, e.g. 57-622.` };
}
