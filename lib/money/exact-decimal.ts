/** An exact decimal: value = units / 10^scale. Used for hours, quantities of time and probabilities. */
export interface ExactDecimal {
  units: bigint;
  scale: number;
}

export type Parsed<T> = { ok: true; value: T } | { ok: false; message: string };

const DECIMAL = /^([+-])?(\d+)(?:\.(\d+))?$/;

/**
 * Parses a plain decimal string with a dot ("1.25", "-0.5", "3") exactly. No exponents, no
 * grouping, no locale: this is for values the app itself writes (hours, probabilities).
 */
export function parseExactDecimal(text: string): Parsed<ExactDecimal> {
  const trimmed = text.trim();
  const m = DECIMAL.exec(trimmed);
  if (!m) return { ok: false, message: `${JSON.stringify(text)} is not a decimal number written like "1.25"` };
  const [, sign, whole = '', fraction = ''] = m;
  const units = BigInt(whole + fraction) * (sign === '-' ? -1n : 1n);
  return { ok: true, value: { units, scale: fraction.length } };
}

export function decimalToString(d: ExactDecimal): string {
  const negative = d.units < 0n;
  const digits = (negative ? -d.units : d.units).toString().padStart(d.scale + 1, '0');
  const body = d.scale === 0 ? digits : `${digits.slice(0, -d.scale)}.${digits.slice(-d.scale)}`;
  return negative ? `-${body}` : body;
}

/** Like decimalToString without trailing fractional zeros: 2.50 → "2.5", 14.00 → "14". */
export function decimalToShortString(d: ExactDecimal): string {
  const text = decimalToString(d);
  return text.includes('.') ? text.replace(/0+$/, '').replace(/\.$/, '') : text;
}

export function compareDecimal(a: ExactDecimal, b: ExactDecimal): -1 | 0 | 1 {
  const scale = Math.max(a.scale, b.scale);
  const x = a.units * 10n ** BigInt(scale - a.scale);
  const y = b.units * 10n ** BigInt(scale - b.scale);
  return x < y ? -1 : x > y ? 1 : 0;
}
