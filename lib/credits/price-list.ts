import type { IsoDate } from '@/lib/calendar';
import type { PriceListEntry } from './types';

/** The entry in force on `onDate`: the latest `effectiveFrom` on or before it. */
export function findPriceOn(priceList: readonly PriceListEntry[], partNumber: string, onDate: IsoDate): PriceListEntry | undefined {
  let best: PriceListEntry | undefined;
  for (const entry of priceList) {
    if (entry.partNumber !== partNumber || entry.effectiveFrom > onDate) continue;
    if (!best || entry.effectiveFrom > best.effectiveFrom) best = entry;
  }
  return best;
}
