import { CalendarInputError } from './input-error';
import { parseIsoDate, type IsoDate } from './iso-date';

/** An instant as an ISO 8601 timestamp with an offset, e.g. `2026-03-02T09:15:00Z` or `2026-03-02T10:15:00+01:00`. */
export type IsoInstant = string;

const INSTANT = /^(\d{4}-\d{2}-\d{2})T(\d{2}):(\d{2})(?::(\d{2})(?:\.\d{1,9})?)?(Z|[+-](\d{2}):(\d{2}))$/i;

/** Milliseconds since the epoch; refuses timestamps without an offset, which would be read in server local time. */
export function parseInstant(value: unknown, field = 'instant'): number {
  if (typeof value !== 'string') throw new CalendarInputError(field, `expected an ISO timestamp as text, got ${value === null ? 'null' : typeof value}`);
  const m = INSTANT.exec(value);
  if (!m) {
    throw new CalendarInputError(field, `'${value}' is not an ISO timestamp with an offset, like 2026-03-02T09:15:00Z or 2026-03-02T10:15:00+01:00`);
  }
  parseIsoDate(m[1], field);
  const hour = Number(m[2]);
  const minute = Number(m[3]);
  const second = Number(m[4] ?? '0');
  if (hour > 23 || minute > 59 || second > 59) throw new CalendarInputError(field, `'${value}': the time of day is out of range`);
  if (m[6] !== undefined && (Number(m[6]) > 23 || Number(m[7]) > 59)) throw new CalendarInputError(field, `'${value}': the offset is out of range`);
  const ms = Date.parse(value);
  if (Number.isNaN(ms)) throw new CalendarInputError(field, `'${value}' could not be read as a timestamp`);
  return ms;
}

const formatters = new Map<string, Intl.DateTimeFormat>();

function formatterFor(timeZone: string, field: string): Intl.DateTimeFormat {
  let f = formatters.get(timeZone);
  if (!f) {
    try {
      f = new Intl.DateTimeFormat('en-US', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit', calendar: 'gregory', numberingSystem: 'latn' });
    } catch {
      throw new CalendarInputError(field, `'${timeZone}' is not a known IANA time zone (e.g. Europe/Berlin, America/Denver)`);
    }
    formatters.set(timeZone, f);
  }
  return f;
}

/** Checks an IANA time-zone name; throws a message naming `field` when unknown. */
export function assertTimeZone(timeZone: unknown, field = 'timeZone'): asserts timeZone is string {
  if (typeof timeZone !== 'string' || timeZone.trim() === '') throw new CalendarInputError(field, 'expected an IANA time-zone name such as Europe/Berlin');
  formatterFor(timeZone, field);
}

/** The calendar date at `epochMs` on the wall clock of `timeZone`. */
export function localDateOfEpoch(epochMs: number, timeZone: string, field = 'timeZone'): IsoDate {
  const parts = formatterFor(timeZone, field).formatToParts(new Date(epochMs));
  const get = (type: Intl.DateTimeFormatPartTypes) => parts.find((p) => p.type === type)?.value ?? '';
  return `${get('year').padStart(4, '0')}-${get('month')}-${get('day')}`;
}

/** The brand-local calendar date of an instant, e.g. localDate('2026-03-01T03:30:00Z', 'America/New_York') = '2026-02-28'. */
export function localDate(instant: IsoInstant, timeZone: string, field = 'instant'): IsoDate {
  assertTimeZone(timeZone);
  return localDateOfEpoch(parseInstant(instant, field), timeZone);
}
