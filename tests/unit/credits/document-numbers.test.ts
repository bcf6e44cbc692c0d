import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { formatClaimNumber, formatCreditMemoNumber, formatRmaNumber, isLuhnValid, luhnCheckDigit, parseDocumentNumber } from '@/lib/credits';

describe('Luhn check digit (ISO/IEC 7812-1 Annex B)', () => {
  it('matches the published worked example: 7992739871 → check digit 3 (Wikipedia, "Luhn algorithm"; from memory)', () => {
    expect(luhnCheckDigit('7992739871')).toBe(3);
    expect(isLuhnValid('79927398713')).toBe(true);
    expect(isLuhnValid('79927398710')).toBe(false);
  });

  it('accepts the widely published card test number 4111 1111 1111 1111 (from memory)', () => {
    expect(isLuhnValid('4111111111111111')).toBe(true);
  });

  it('catches every single-digit substitution (property of the algorithm stated in ISO/IEC 7812-1)', () => {
    fc.assert(
      fc.property(fc.stringMatching(/^\d{6,14}$/), fc.nat(), fc.integer({ min: 1, max: 9 }), (payload, pos, bump) => {
        const full = payload + luhnCheckDigit(payload);
        const i = pos % full.length;
        const wrong = full.slice(0, i) + ((Number(full[i]) + bump) % 10) + full.slice(i + 1);
        expect(isLuhnValid(full)).toBe(true);
        expect(isLuhnValid(wrong)).toBe(false);
      }),
    );
  });
});

describe('our document numbers', () => {
  it('formats claim, RMA and credit memo numbers', () => {
    expect(formatClaimNumber({ year: 2025, sequence: 123 })).toBe('WC-2025-000123-5');
    expect(formatRmaNumber({ year: 2025, sequence: 42 })).toBe('RMA-2025-000042-7');
    expect(formatCreditMemoNumber({ year: 2025, sequence: 1337 })).toBe('CM-2025-001337-0');
    expect(formatCreditMemoNumber({ year: 2026, sequence: 1_234_567 })).toMatch(/^CM-2026-1234567-\d$/);
  });

  it('reads numbers as typed: any case, spaces or no dashes; refuses a wrong check digit', () => {
    expect(parseDocumentNumber('cm 2025 001337 0')).toEqual({ ok: true, kind: 'credit_memo', year: 2025, sequence: 1337, canonical: 'CM-2025-001337-0' });
    expect(parseDocumentNumber('RMA2025-0000427')).toMatchObject({ ok: true, kind: 'rma', sequence: 42 });
    expect(parseDocumentNumber('CM-2025-001337-1')).toEqual({ ok: false, message: '"CM-2025-001337-1": the check digit does not match; the number is mistyped' });
    expect(parseDocumentNumber('CM-2025-010337-0').ok).toBe(false); // neighbouring digits swapped
    expect(parseDocumentNumber('INV-2025-1').ok).toBe(false);
  });

  it('round-trips every formatted number', () => {
    fc.assert(
      fc.property(fc.integer({ min: 2000, max: 2099 }), fc.integer({ min: 1, max: 99_999_999 }), (year, sequence) => {
        for (const f of [formatClaimNumber, formatRmaNumber, formatCreditMemoNumber]) {
          const n = f({ year, sequence });
          expect(parseDocumentNumber(n)).toMatchObject({ ok: true, year, sequence, canonical: n });
        }
      }),
    );
  });

  it('refuses an impossible year or sequence', () => {
    expect(() => formatClaimNumber({ year: 25, sequence: 1 })).toThrow(/year: 25/);
    expect(() => formatClaimNumber({ year: 2025, sequence: 0 })).toThrow(/sequence: 0/);
  });
});
