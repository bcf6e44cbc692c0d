import { describe, expect, it } from 'vitest';
import { isoCircumferenceM, parseTyreSize, wheelCircumference } from '@/lib/units';

const tyre = (s: string) => {
  const r = parseTyreSize(s);
  if (!r.ok) throw new Error(r.message);
  return r;
};

describe('ISO 5775 tyre sizes', () => {
  it('reads "57-622" as 57 mm section width on a 622 mm bead seat (ISO 5775-1)', () => {
    const r = tyre('57-622');
    expect(r.tyre).toMatchObject({ widthMm: 57, bsdMm: 622, iso: '57-622' });
    expect(r.note).toBeUndefined();
  });

  it('accepts spacing and an ETRTO prefix', () => {
    expect(tyre(' ETRTO 57 - 622 ').tyre.iso).toBe('57-622');
    expect(tyre('iso 40-584').tyre.iso).toBe('40-584');
  });

  it('maps decimal-width inch sizes to the bead seats of the reference table (622 = 29"/28", 584 = 27.5", 559 = 26", 507 = 24", 406 = 20")', () => {
    expect(tyre('29 x 2.25').tyre).toMatchObject({ widthMm: 57, bsdMm: 622, convertedFrom: '29 x 2.25' });
    expect(tyre('27.5x2.40').tyre).toMatchObject({ widthMm: 61, bsdMm: 584 });
    expect(tyre('26" x 2.10"').tyre).toMatchObject({ widthMm: 53, bsdMm: 559 });
    expect(tyre('24 x 1.95').tyre.bsdMm).toBe(507);
    expect(tyre('20 x 4.0').tyre).toMatchObject({ widthMm: 102, bsdMm: 406 });
    expect(tyre('29 x 2.25').note).toMatch(/622 mm bead seat.*prefer the ISO size/);
  });

  it('maps French 700C and 650B sizes (622 and 584 mm bead seats)', () => {
    expect(tyre('700 x 35C').tyre.iso).toBe('35-622');
    expect(tyre('700c x 40').tyre.iso).toBe('40-622');
    expect(tyre('650B x 47').tyre.iso).toBe('47-584');
  });

  const refusals: Array<[string, RegExp]> = [
    ['', /Enter the tyre size/],
    ['26 x 1 3/8', /fractional inch size/],
    ['28 x 1 5/8 x 1 3/8', /fractional inch size/],
    ['16 x 2.125', /16-inch size is not one we map/],
    ['29 x 2', /width with its decimals/],
    ['650 x 38A', /only 700C and 650B/],
    ['700 x 35', /only 700C and 650B/],
    ['622-57', /not a tyre size we can read/],
    ['5-622', /not a tyre size we can read/],
    ['12-622', /width 12 mm is outside/],
    ['57-999', /Bead seat diameter 999 mm is outside/],
    ['big tyre', /not a tyre size we can read/],
  ];
  for (const [input, message] of refusals) {
    it(`refuses "${input}" with a message saying what to enter`, () => {
      const r = parseTyreSize(input);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.message).toMatch(message);
    });
  }
});

describe('rolling circumference π × (BSD + 2 × width)', () => {
  it('28-622 → 678 mm × π ≈ 2130 mm (Sheldon Brown, "Cyclecomputer Calibration")', () => {
    expect(isoCircumferenceM(tyre('28-622').tyre) * 1000).toBeCloseTo(2130, -1);
    expect(Math.abs(isoCircumferenceM(tyre('28-622').tyre) * 1000 - 2130)).toBeLessThan(1);
  });

  it('57-622 → 2312.2 mm, 60-584 → 2211.7 mm, 65-559 → 2164.6 mm (same formula, reference-values.md)', () => {
    expect(isoCircumferenceM(tyre('57-622').tyre) * 1000).toBeCloseTo(2312.2, 1);
    expect(isoCircumferenceM(tyre('60-584').tyre) * 1000).toBeCloseTo(2211.7, 1);
    expect(isoCircumferenceM(tyre('65-559').tyre) * 1000).toBeCloseTo(2164.6, 1);
  });

  it('a measured roll-out wins over the ISO estimate', () => {
    const w = wheelCircumference({ tyre: '57-622', measuredMm: 2250 });
    expect(w.ok && w.source).toBe('measured');
    expect(w.ok && w.metres).toBe(2.25);
    expect(w.ok && w.estimateM).toBeCloseTo(2.3122, 4);
    expect(w.ok && w.notes).toEqual([]);
  });

  it('notes a measurement far from the estimate, and uses the estimate when nothing was measured', () => {
    const far = wheelCircumference({ tyre: '57-622', measuredMm: 2100 });
    expect(far.ok && far.notes[0]).toMatch(/differs by -9\.2 %.*check the measurement/);
    const est = wheelCircumference({ tyre: '57-622' });
    expect(est.ok && est.source).toBe('iso-estimate');
  });

  it('refuses an implausible measurement or a missing size, naming the field', () => {
    expect(wheelCircumference({ tyre: '57-622', measuredMm: 2.3 })).toMatchObject({ ok: false, field: 'measuredMm' });
    expect(wheelCircumference({})).toMatchObject({ ok: false, field: 'tyre' });
    expect(wheelCircumference({ tyre: '26 x 1 3/8' })).toMatchObject({ ok: false, field: 'tyre' });
  });
});
