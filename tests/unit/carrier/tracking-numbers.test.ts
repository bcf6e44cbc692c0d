import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  CARRIERS,
  checkTrackingNumber,
  dealerTrackingWord,
  ferruleCheckDigit,
  ferruleNumber,
  makeTrackingNumber,
  skeinwayCheckLetter,
  skeinwayNumber,
} from '@/lib/carrier/carriers';

// Both carriers and their number formats are our own inventions; the examples below were worked by hand.

describe('Ferrule Parcel numbers: FP + 9 digits + a check digit (weights 3, 1, 3, 1… from the left, mod 10)', () => {
  it('482139760 → 4·3 + 8 + 2·3 + 1 + 3·3 + 9 + 7·3 + 6 + 0·3 = 72 → check 8 (worked by hand)', () => {
    expect(ferruleCheckDigit('482139760')).toBe(8);
    expect(ferruleNumber(482139760)).toBe('FP4821397608');
    // 000000001: the 1 is the 9th digit, weight 3 → sum 3 → check (10 − 3) mod 10 = 7.
    expect(ferruleNumber(1)).toBe('FP0000000017');
  });

  it('reads numbers as people type them and refuses the wrong format or check digit', () => {
    expect(checkTrackingNumber('ferrule', ' fp-4821 3976 08 ')).toEqual({ ok: true, canonical: 'FP4821397608' });
    expect(checkTrackingNumber('ferrule', 'FP4821397609')).toMatchObject({ ok: false, message: expect.stringMatching(/check digit does not match/) });
    expect(checkTrackingNumber('ferrule', 'FP482139760')).toMatchObject({ ok: false, message: expect.stringMatching(/is not a Ferrule Parcel tracking number: FP followed by 10 digits/) });
    expect(checkTrackingNumber('ferrule', 'SK-4821-3976-G')).toMatchObject({ ok: false });
    expect(checkTrackingNumber('ferrule', '')).toMatchObject({ ok: false, message: expect.stringMatching(/^Enter the Ferrule Parcel tracking number/) });
    expect(checkTrackingNumber('postal-pigeon', 'FP4821397608')).toMatchObject({ ok: false, message: expect.stringMatching(/not a carrier we ship with/) });
  });

  it('catches every single mistyped digit (property, fast-check)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 999_999_999 }), fc.integer({ min: 2, max: 11 }), fc.integer({ min: 1, max: 9 }), (serial, pos, bump) => {
        const n = ferruleNumber(serial);
        const wrong = n.slice(0, pos) + String((Number(n[pos]) + bump) % 10) + n.slice(pos + 1);
        expect(checkTrackingNumber('ferrule', wrong).ok).toBe(false);
      }),
    );
  });
});

describe('Skeinway Express numbers: SK-dddd-dddd-L (digit × (position + 2), summed, mod 23, as a letter without I, O, Z)', () => {
  it('48213976 → 4·2 + 8·3 + 2·4 + 1·5 + 3·6 + 9·7 + 7·8 + 6·9 = 236; 236 mod 23 = 6 → G (worked by hand)', () => {
    expect(skeinwayCheckLetter('48213976')).toBe('G');
    expect(skeinwayNumber(48213976)).toBe('SK-4821-3976-G');
  });

  it('reads any spacing or case; refuses a wrong letter', () => {
    expect(checkTrackingNumber('skeinway', 'sk 4821 3976 g')).toEqual({ ok: true, canonical: 'SK-4821-3976-G' });
    expect(checkTrackingNumber('skeinway', 'SK-4821-3976-H')).toMatchObject({ ok: false, message: expect.stringMatching(/check letter does not match/) });
    expect(checkTrackingNumber('skeinway', 'FP4821397608')).toMatchObject({ ok: false, message: expect.stringMatching(/not a Skeinway Express tracking number/) });
  });

  it('catches every single mistyped digit and every swap of neighbouring digits (weights 2–9 are prime to 23)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 99_999_999 }), fc.integer({ min: 0, max: 7 }), (serial, i) => {
        const digits = String(serial).padStart(8, '0');
        const letter = skeinwayCheckLetter(digits);
        const bumped = digits.slice(0, i) + String((Number(digits[i]) + 1 + (serial % 8)) % 10) + digits.slice(i + 1);
        if (bumped !== digits) expect(skeinwayCheckLetter(bumped)).not.toBe(letter);
        if (i < 7 && digits[i] !== digits[i + 1]) {
          const swapped = digits.slice(0, i) + digits[i + 1] + digits[i] + digits.slice(i + 2);
          expect(skeinwayCheckLetter(swapped)).not.toBe(letter);
        }
      }),
    );
  });
});

describe('generated numbers and the words the dealer reads', () => {
  it('every generated number passes its own carrier’s check', () => {
    fc.assert(
      fc.property(fc.constantFrom('ferrule' as const, 'skeinway' as const), fc.integer({ min: 0, max: 2 ** 40 }), (carrier, serial) => {
        const n = makeTrackingNumber(carrier, serial);
        expect(checkTrackingNumber(carrier, n)).toEqual({ ok: true, canonical: n });
      }),
    );
    for (const c of Object.values(CARRIERS)) expect(checkTrackingNumber(c.code, c.tracking.example).ok).toBe(true);
  });

  it('maps carrier statuses to shipped / in transit / delivered', () => {
    expect(dealerTrackingWord('label_created')).toBe('shipped');
    expect(dealerTrackingWord('picked_up')).toBe('in transit');
    expect(dealerTrackingWord('out_for_delivery')).toBe('in transit');
    expect(dealerTrackingWord('delivered')).toBe('delivered');
    expect(dealerTrackingWord('exception')).toBe('held up');
  });
});
