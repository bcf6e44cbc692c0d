import type { CreditInput } from '@/lib/credits';

// Invented demo values: part numbers, prices and rates are ours, for these tests only.
export const priceList = [
  { partNumber: 'CTL-36V-20A', dealerNetMinor: 14000, effectiveFrom: '2024-07-01' },
  { partNumber: 'CTL-36V-20A', dealerNetMinor: 14250, effectiveFrom: '2025-01-01' },
  { partNumber: 'CTL-36V-20A', dealerNetMinor: 15000, effectiveFrom: '2025-06-01' },
  { partNumber: 'HUB-250-R', dealerNetMinor: 38900, effectiveFrom: '2025-01-01' },
  { partNumber: 'BAT-36-14', dealerNetMinor: 51240, effectiveFrom: '2025-01-01' },
  { partNumber: 'DSP-MONO-2', dealerNetMinor: 8800, effectiveFrom: '2025-01-01' },
];

export function baseInput(overrides: Partial<CreditInput> = {}): CreditInput {
  return {
    currency: 'USD',
    priceDate: '2025-03-10',
    priceList,
    parts: [],
    labor: [],
    laborRates: { dealerRateMinor: 9500, brandMaxRateMinor: 8000 },
    laborRelease: { state: 'verified_by_test' },
    ...overrides,
  };
}
