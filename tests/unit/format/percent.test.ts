import { describe, expect, it } from 'vitest';
import { signedPct } from '@/lib/format/percent';

describe('signedPct', () => {
  it('signs a rise, keeps the minus of a fall, and rounds to one decimal', () => {
    expect(signedPct(122.345)).toBe('+122.3 %');
    expect(signedPct(-4.25)).toBe('-4.3 %');
  });
  it('a change too small to show reads 0.0 %, without a sign', () => {
    expect(signedPct(-0.01)).toBe('0.0 %');
    expect(signedPct(0.04)).toBe('0.0 %');
    expect(signedPct(-0)).toBe('0.0 %');
  });
  it('nothing to compare reads as a dash', () => {
    expect(signedPct(null)).toBe('—');
    expect(signedPct(Number.NaN)).toBe('—');
  });
});
