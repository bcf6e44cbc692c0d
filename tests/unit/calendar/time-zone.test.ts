import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { localDate, parseInstant } from '@/lib/calendar';

describe('brand-local dates from instants (Intl.DateTimeFormat, IANA tz database)', () => {
  it('New York is UTC−5 before US daylight time starts on 2026-03-08 (15 U.S.C. 260a: second Sunday in March)', () => {
    expect(localDate('2026-03-01T03:30:00Z', 'America/New_York')).toBe('2026-02-28');
  });

  it('Berlin changes from UTC+1 to UTC+2 at 01:00 UTC on the last Sunday of March (Directive 2000/84/EC)', () => {
    expect(localDate('2026-03-28T23:30:00Z', 'Europe/Berlin')).toBe('2026-03-29'); // 00:30 CET
    expect(localDate('2026-03-29T22:30:00Z', 'Europe/Berlin')).toBe('2026-03-30'); // 00:30 CEST
    expect(localDate('2026-03-29T21:30:00Z', 'Europe/Berlin')).toBe('2026-03-29'); // 23:30 CEST
  });

  it('Auckland is UTC+13 in New Zealand summer', () => {
    expect(localDate('2026-03-01T12:00:00Z', 'Pacific/Auckland')).toBe('2026-03-02');
  });

  it('honours the offset written in the timestamp', () => {
    expect(localDate('2026-03-02T00:30:00+01:00', 'UTC')).toBe('2026-03-01');
  });

  it('in UTC equals the date part of toISOString (property, ECMA-262)', () => {
    fc.assert(
      fc.property(fc.date({ min: new Date('1971-01-01T00:00:00Z'), max: new Date('2099-12-31T23:59:59Z'), noInvalidDate: true }), (d) => {
        expect(localDate(d.toISOString(), 'UTC')).toBe(d.toISOString().slice(0, 10));
      }),
    );
  });

  it('refuses timestamps without an offset and unknown zones', () => {
    expect(() => parseInstant('2026-03-02T09:00:00', 'startedAt')).toThrow(/startedAt: '2026-03-02T09:00:00' is not an ISO timestamp with an offset/);
    expect(() => parseInstant('2026-02-30T09:00:00Z', 'now')).toThrow(/now: '2026-02-30': day 30 does not exist/);
    expect(() => parseInstant('2026-03-02T25:00:00Z', 'now')).toThrow(/time of day is out of range/);
    expect(() => localDate('2026-03-02T09:00:00Z', 'Europe/Atlantis')).toThrow(/timeZone: 'Europe\/Atlantis' is not a known IANA time zone/);
  });
});
