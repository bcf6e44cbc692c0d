import { isCurrencyCode, minorUnitExponent, type CurrencyCode } from './currency';
import type { Parsed } from './exact-decimal';
import type { MinorUnits } from './minor-units';

/**
 * Which character separates the decimals. The caller states it per statement or per user; it is
 * never guessed, because "1.234" means 1.234 in one convention and 1234 in the other.
 *   '.'  →  1,234.50   1 234.50   1'234.50
 *   ','  →  1.234,50   1 234,50
 */
export type DecimalSeparator = '.' | ',';

export interface ParseAmountOptions {
  currency: CurrencyCode;
  decimalSeparator?: DecimalSeparator;
}

const SPACES = [' ', '\u00a0', '\u202f'];
const GROUPING: Record<DecimalSeparator, string[]> = {
  '.': [',', "'", '\u2019', ...SPACES],
  ',': ['.', ...SPACES],
};

/** Currency symbols accepted beside the number, and the currencies each may stand for. */
const SYMBOLS: Record<string, readonly CurrencyCode[]> = {
  $: ['USD', 'CAD', 'AUD', 'NZD'],
  '€': ['EUR'],
  '£': ['GBP'],
  '¥': ['JPY'],
  '￥': ['JPY'],
  '₩': ['KRW'],
};
/** Country letters some locales put beside a symbol ("US$", "$CA", "£GB", "A$"). */
const SYMBOL_COUNTRY: Record<string, CurrencyCode> = { US: 'USD', CA: 'CAD', A: 'AUD', AU: 'AUD', NZ: 'NZD', GB: 'GBP' };

const MINUS = ['-', '\u2212'];

/**
 * Parses an amount as written on a statement or typed by a user into exact minor units.
 *
 * Accepted: grouping per the stated separator ("1,234.50" / "1.234,50"), a leading or trailing
 * minus ("-12.30", "12.30-"), parentheses for a negative ("(12.30)", the accounting convention on
 * printed statements), a leading "+", the ISO code or a symbol of the same currency on either side.
 * Decimals beyond the currency's minor unit are accepted only when they are zeros ("12.300").
 * Anything else is refused with a message saying what is wrong; nothing is rounded.
 */
export function parseAmount(text: string, options: ParseAmountOptions): Parsed<MinorUnits> {
  const { currency } = options;
  const sep = options.decimalSeparator ?? '.';
  const fail = (message: string): Parsed<MinorUnits> => ({ ok: false, message });

  let s = text.trim();
  if (s === '') return fail('the amount is empty');

  let signs = 0;
  // Peel signs, parentheses and currency marks off both ends, in any order
  // ("-$12.30", "$-12.30", "($12.30)", "USD (12.30)", "12,30 € -").
  for (let changed = true; changed; ) {
    changed = false;
    if (s.startsWith('(') && s.endsWith(')')) {
      signs++;
      s = s.slice(1, -1).trim();
      changed = true;
    }
    const lead = s[0];
    if (lead !== undefined && MINUS.includes(lead)) {
      signs++;
      s = s.slice(1).trim();
      changed = true;
    } else if (lead === '+') {
      s = s.slice(1).trim();
      changed = true;
    }
    const trail = s[s.length - 1];
    if (trail !== undefined && MINUS.includes(trail) && s.length > 1) {
      signs++;
      s = s.slice(0, -1).trim();
      changed = true;
    }
    const mark = peelCurrencyMark(s);
    if (mark) {
      if (!mark.currencies.includes(currency)) {
        return fail(`the amount is marked "${mark.mark}" but this statement is in ${currency}`);
      }
      s = mark.rest;
      changed = true;
    }
  }
  if (signs > 1) return fail(`"${text.trim()}" has more than one minus sign or parenthesis`);
  if (!/\d/.test(s)) return fail(`"${text.trim()}" is not an amount: it has no digits`);

  const otherSep = sep === '.' ? ',' : '.';
  const sepCount = s.split(sep).length - 1;
  if (sepCount > 1) {
    return fail(`"${text.trim()}" has more than one decimal separator "${sep}"`);
  }
  const [wholePart = '', fractionPart] = s.split(sep);

  if (fractionPart === '') return fail(`"${text.trim()}" ends with a decimal separator and no decimals`);
  if (fractionPart !== undefined && !/^\d+$/.test(fractionPart)) {
    if (fractionPart.includes(otherSep)) {
      return fail(
        `"${text.trim()}" looks written with "${otherSep}" as the decimal separator, but this statement is set to "${sep}"`,
      );
    }
    return fail(`"${text.trim()}" is not a number: unexpected characters after the decimal separator`);
  }

  const whole = parseWholeDigits(wholePart, GROUPING[sep]);
  if (whole === null) {
    if (wholePart.includes(otherSep) && !GROUPING[sep].includes(otherSep)) {
      return fail(
        `"${text.trim()}" looks written with "${otherSep}" as the decimal separator, but this statement is set to "${sep}"`,
      );
    }
    return fail(`"${text.trim()}" is not a number (digit grouping must be in threes, with one grouping character)`);
  }

  const exponent = minorUnitExponent(currency);
  let fraction = fractionPart ?? '';
  if (fraction.length > exponent) {
    const excess = fraction.slice(exponent);
    if (/[^0]/.test(excess)) {
      return fail(
        exponent === 0
          ? `"${text.trim()}" has decimals, but ${currency} has no minor unit`
          : `"${text.trim()}" has ${fraction.length} decimals, but ${currency} has ${exponent}`,
      );
    }
    fraction = fraction.slice(0, exponent);
  }
  const minor = BigInt((whole === '' ? '0' : whole) + fraction.padEnd(exponent, '0')) * (signs === 1 ? -1n : 1n);
  if (minor > BigInt(Number.MAX_SAFE_INTEGER) || minor < BigInt(Number.MIN_SAFE_INTEGER)) {
    return fail(`"${text.trim()}" is too large an amount`);
  }
  const value = Number(minor);
  return { ok: true, value: value === 0 ? 0 : value };
}

function peelCurrencyMark(s: string): { mark: string; currencies: readonly CurrencyCode[]; rest: string } | null {
  const code = /^([A-Za-z]{3})\s*(?=[\d(+\-\u2212.,])|(?<=[\d)\s])\s*([A-Za-z]{3})$/.exec(s);
  if (code) {
    const raw = (code[1] ?? code[2] ?? '').toUpperCase();
    const rest = code[1] ? s.slice(code[0].length) : s.slice(0, s.length - code[0].length);
    return { mark: raw, currencies: isCurrencyCode(raw) ? [raw] : [], rest: rest.trim() };
  }
  const symbol = /^([A-Z]{0,2})([$€£¥￥₩])([A-Z]{0,2})/.exec(s) ?? /([A-Z]{0,2})([$€£¥￥₩])([A-Z]{0,2})$/.exec(s);
  if (!symbol) return null;
  const [mark, before = '', sign = '', after = ''] = symbol;
  let currencies = SYMBOLS[sign] ?? [];
  const country = before || after;
  if (country) {
    const named = SYMBOL_COUNTRY[country];
    currencies = named && currencies.includes(named) ? [named] : [];
  }
  const rest = symbol.index === 0 ? s.slice(mark.length) : s.slice(0, symbol.index);
  return { mark, currencies, rest: rest.trim() };
}

/** Digits of the whole part with grouping removed, or null when grouping is malformed. */
function parseWholeDigits(part: string, grouping: string[]): string | null {
  if (/^\d*$/.test(part)) return part;
  const used = [...new Set([...part].filter((c) => !/\d/.test(c)))];
  if (used.length !== 1) return null;
  const g = used[0] as string;
  if (!grouping.includes(g)) return null;
  const groups = part.split(g);
  const [first, ...rest] = groups;
  if (first === undefined || !/^\d{1,3}$/.test(first) || !rest.every((x) => /^\d{3}$/.test(x))) return null;
  return groups.join('');
}
