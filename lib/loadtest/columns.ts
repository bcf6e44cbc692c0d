import type { CurrentUnit, PowerUnit, SpeedUnit, TimeUnit, TorqueUnit, VoltageUnit } from '@/lib/units';

/** What a column holds, in which unit. `ignore` leaves a column out. */
export type ColumnRole =
  | { readonly quantity: 'time'; readonly unit: TimeUnit }
  | { readonly quantity: 'speed'; readonly unit: SpeedUnit }
  | { readonly quantity: 'wheelPower'; readonly unit: PowerUnit }
  | { readonly quantity: 'wheelTorque'; readonly unit: TorqueUnit }
  | { readonly quantity: 'voltage'; readonly unit: VoltageUnit }
  | { readonly quantity: 'current'; readonly unit: CurrentUnit }
  | { readonly quantity: 'ignore' };

export type ColumnQuantity = Exclude<ColumnRole['quantity'], 'ignore'>;

/** A dealer's mapping: column header as in the file → what it holds. */
export type ColumnMapping = Readonly<Record<string, ColumnRole>>;

/** Units allowed per quantity, by id (the same ids as the column-name suffixes). */
export const QUANTITY_UNITS = {
  time: ['s', 'ms', 'min', 'h'],
  speed: ['kmh', 'mph', 'ms'],
  wheelPower: ['w', 'kw', 'hp'],
  wheelTorque: ['nm', 'lbft'],
  voltage: ['v', 'mv'],
  current: ['a', 'ma'],
} as const satisfies Record<ColumnQuantity, readonly string[]>;

/** The column names we recognise at once: prefix per quantity + "_" + unit id. */
const PREFIX: Record<ColumnQuantity, string> = {
  time: 'time',
  speed: 'speed',
  wheelPower: 'wheel_power',
  wheelTorque: 'wheel_torque',
  voltage: 'voltage',
  current: 'current',
};

export const KNOWN_COLUMNS: Readonly<Record<string, ColumnRole>> = Object.fromEntries(
  (Object.keys(QUANTITY_UNITS) as ColumnQuantity[]).flatMap((q) =>
    QUANTITY_UNITS[q].map((u) => [`${PREFIX[q]}_${u}`, { quantity: q, unit: u } as ColumnRole]),
  ),
);

/** Case- and space-insensitive form of a header: "Speed KMH" → "speed_kmh". */
export function normalizeHeader(header: string): string {
  return header.trim().toLowerCase().replace(/[\s-]+/g, '_');
}

export function recognizeColumn(header: string): ColumnRole | null {
  return KNOWN_COLUMNS[normalizeHeader(header)] ?? null;
}

/** How sure a guess is: our own column name; quantity and unit both read from the header; only one of them. */
export type GuessConfidence = 'certain' | 'likely' | 'unsure';

export interface ColumnGuess {
  readonly header: string;
  readonly columnNumber: number;
  /** Best guess, or null when the header says nothing we know. `unit` is null when only the quantity was read. */
  readonly guess: { readonly quantity: ColumnQuantity; readonly unit: string | null } | null;
  readonly confidence: GuessConfidence | null;
}

const QUANTITY_WORDS: ReadonlyArray<[ColumnQuantity, RegExp]> = [
  ['time', /\b(time|elapsed|timestamp|zeit|temps|tijd|tempo)\b/],
  ['speed', /\b(speed|velocity|geschwindigkeit|vitesse|snelheid|velocit[aà])\b/],
  ['wheelTorque', /\b(torque|drehmoment|couple|koppel|coppia)\b/],
  ['wheelPower', /\b(power|leistung|puissance|vermogen|potenza)\b/],
  ['voltage', /\b(voltage|spannung|tension|spanning|tensione)\b/],
  ['current', /\b(current|strom|courant|stroom|corrente)\b/],
];

/** One-letter symbols ("t [s]", "P [W]"): only trusted when a unit of the same quantity follows. */
const SYMBOLS: Readonly<Record<string, ColumnQuantity>> = { t: 'time', v: 'speed', p: 'wheelPower', m: 'wheelTorque', u: 'voltage', i: 'current' };

const UNIT_WORDS: ReadonlyArray<[ColumnQuantity, string, RegExp]> = [
  ['speed', 'kmh', /\b(km\/h|kmh|kph)\b/],
  ['speed', 'mph', /\b(mph|mi\/h)\b/],
  ['speed', 'ms', /\b(m\/s|mps)\b/],
  ['wheelTorque', 'lbft', /\b(lbf?[\s.·*-]?ft|ft[\s.·*-]?lbf?)\b/],
  ['wheelTorque', 'nm', /\b(n[\s.·*-]?m|newton[\s-]?met(er|re)s?)\b/],
  ['wheelPower', 'kw', /\b(kw|kilowatts?)\b/],
  ['wheelPower', 'hp', /\b(hp|horsepower)\b/],
  ['wheelPower', 'w', /\b(w|watts?)\b/],
  ['time', 'ms', /\b(ms|msec|milliseconds?)\b/],
  ['time', 'min', /\b(min|minutes?)\b/],
  ['time', 'h', /\b(h|hours?|hr)\b/],
  ['time', 's', /\b(s|sec|secs|seconds?)\b/],
  ['voltage', 'mv', /\b(mv|millivolts?)\b/],
  ['voltage', 'v', /\b(v|volts?)\b/],
  ['current', 'ma', /\b(ma|milliamps?)\b/],
  ['current', 'a', /\b(a|amps?|amperes?)\b/],
];

/**
 * Best guess for one header: our own names first; otherwise a quantity word and a unit read from
 * the header (in brackets or not), e.g. "Roller speed [km/h]" → speed in km/h. A bare unit
 * ("km/h") gives an unsure guess; a header we cannot read gives none.
 */
export function guessColumn(header: string, columnNumber: number): ColumnGuess {
  const known = recognizeColumn(header);
  if (known && known.quantity !== 'ignore') {
    return { header, columnNumber, guess: { quantity: known.quantity, unit: known.unit }, confidence: 'certain' };
  }
  const text = header.toLowerCase().replace(/[()[\]{}<>_]/g, ' ').replace(/\s+/g, ' ').trim();
  const units = UNIT_WORDS.filter(([, , re]) => re.test(text));
  const unitFor = (q: ColumnQuantity) => units.find(([uq]) => uq === q)?.[1] ?? null;
  const none: ColumnGuess = { header, columnNumber, guess: null, confidence: null };

  const word = QUANTITY_WORDS.find(([, re]) => re.test(text))?.[0];
  if (word) {
    const unit = unitFor(word);
    return { header, columnNumber, guess: { quantity: word, unit }, confidence: unit ? 'likely' : 'unsure' };
  }
  const symbol = SYMBOLS[text.split(' ')[0] ?? ''];
  if (symbol) {
    const unit = unitFor(symbol);
    return unit ? { header, columnNumber, guess: { quantity: symbol, unit }, confidence: 'likely' } : none;
  }
  // A bare unit of more than one letter still says what the column holds, except "ms" (m/s or milliseconds?) and "min" (minutes or minimum?).
  const bare = units.find(([, u, re]) => u.length > 1 && !['ms', 'min'].includes(u) && re.test(text));
  return bare ? { header, columnNumber, guess: { quantity: bare[0], unit: bare[1] }, confidence: 'unsure' } : none;
}

/** 64-bit FNV-1a over UTF-16 code units; stable across runtimes. */
function fnv1a64(text: string): string {
  let h = 0xcbf29ce484222325n;
  const prime = 0x100000001b3n;
  const mask = 0xffffffffffffffffn;
  for (let i = 0; i < text.length; i++) {
    h ^= BigInt(text.charCodeAt(i));
    h = (h * prime) & mask;
  }
  return h.toString(16).padStart(16, '0');
}

/**
 * A stable key for a set of headers, so the app can remember a dealer's mapping. Order-insensitive
 * (mappings are by header name) and case/space-insensitive; empty headers (trailing delimiters) do
 * not count. Format: "hs1-" + 16 hex digits.
 */
export function headerSignature(headers: readonly string[]): string {
  const names = headers
    .map(normalizeHeader)
    .filter((h) => h !== '')
    .sort();
  return `hs1-${fnv1a64(names.join('\u001f'))}`;
}
