import { isIsoDate, toDayNumber, type IsoDate } from '@/lib/calendar';
import { fromBigInt, isCurrencyCode, isMinorUnits, type CurrencyCode, type MinorUnits } from '@/lib/money';
import { ReconciliationInputError } from './input-error';

/** A credit issued but not reconciled, or a chargeback not yet settled. */
export interface OpenItem {
  id: string;
  dealerId: string;
  currency: CurrencyCode;
  /** Positive: a credit owed to the dealer. Negative: a chargeback owed by the dealer. */
  amountMinor: MinorUnits;
  issuedOn: IsoDate;
}

export type AgingBucket = 'days_0_30' | 'days_31_60' | 'days_61_90' | 'days_over_90';
export const AGING_BUCKETS: readonly AgingBucket[] = ['days_0_30', 'days_31_60', 'days_61_90', 'days_over_90'];
export const AGING_BUCKET_LABELS: Record<AgingBucket, string> = {
  days_0_30: '0–30 days',
  days_31_60: '31–60 days',
  days_61_90: '61–90 days',
  days_over_90: 'over 90 days',
};

/** Age in whole calendar days from the issue date to the as-of date: issued today is 0. */
export function agingBucket(ageDays: number): AgingBucket {
  if (ageDays <= 30) return 'days_0_30';
  if (ageDays <= 60) return 'days_31_60';
  if (ageDays <= 90) return 'days_61_90';
  return 'days_over_90';
}

export interface BucketTotals {
  amounts: Record<AgingBucket, MinorUnits>;
  counts: Record<AgingBucket, number>;
  totalMinor: MinorUnits;
  count: number;
}

export interface AgingRow {
  dealerId: string;
  currency: CurrencyCode;
  credits: BucketTotals;
  chargebacks: BucketTotals;
  /** credits + chargebacks: what the brand owes the dealer net, per bucket. */
  net: BucketTotals;
}

export interface AgingReport {
  asOf: IsoDate;
  /** One row per dealer and currency, sorted by dealer then currency. */
  rows: AgingRow[];
  /** All dealers together, one row per currency (dealerId is "*"). */
  totals: AgingRow[];
}

type Acc = { amounts: Record<AgingBucket, bigint>; counts: Record<AgingBucket, number> };
const emptyAcc = (): Acc => ({
  amounts: { days_0_30: 0n, days_31_60: 0n, days_61_90: 0n, days_over_90: 0n },
  counts: { days_0_30: 0, days_31_60: 0, days_61_90: 0, days_over_90: 0 },
});

/**
 * Ages open items as of a date into 0–30, 31–60, 61–90 and over-90-day buckets, per dealer and
 * currency, with exact totals. Items of amount 0 are nothing open and are skipped; an item issued
 * after the as-of date is refused.
 */
export function ageOpenItems(items: readonly OpenItem[], asOf: IsoDate): AgingReport {
  if (!isIsoDate(asOf)) throw new ReconciliationInputError(`asOf: ${JSON.stringify(asOf)} is not a date YYYY-MM-DD`);
  const today = toDayNumber(asOf);
  const rows = new Map<string, { dealerId: string; currency: CurrencyCode; credits: Acc; chargebacks: Acc }>();
  const totals = new Map<CurrencyCode, { dealerId: string; currency: CurrencyCode; credits: Acc; chargebacks: Acc }>();
  for (const item of items) {
    const where = `open item ${item.id}`;
    if (!item.dealerId) throw new ReconciliationInputError(`${where}: dealerId is required`);
    if (!isCurrencyCode(item.currency)) throw new ReconciliationInputError(`${where}: currency ${JSON.stringify(item.currency)} is not supported`);
    if (!isMinorUnits(item.amountMinor)) throw new ReconciliationInputError(`${where}: amountMinor must be a whole number of minor units`);
    if (!isIsoDate(item.issuedOn)) throw new ReconciliationInputError(`${where}: issuedOn ${JSON.stringify(item.issuedOn)} is not YYYY-MM-DD`);
    const age = today - toDayNumber(item.issuedOn);
    if (age < 0) throw new ReconciliationInputError(`${where}: issued on ${item.issuedOn}, after the as-of date ${asOf}`);
    if (item.amountMinor === 0) continue;
    const bucket = agingBucket(age);
    const key = `${item.dealerId}\u0000${item.currency}`;
    let row = rows.get(key);
    if (!row) rows.set(key, (row = { dealerId: item.dealerId, currency: item.currency, credits: emptyAcc(), chargebacks: emptyAcc() }));
    let total = totals.get(item.currency);
    if (!total) totals.set(item.currency, (total = { dealerId: '*', currency: item.currency, credits: emptyAcc(), chargebacks: emptyAcc() }));
    for (const r of [row, total]) {
      const acc = item.amountMinor > 0 ? r.credits : r.chargebacks;
      acc.amounts[bucket] += BigInt(item.amountMinor);
      acc.counts[bucket] += 1;
    }
  }
  const finish = (r: { dealerId: string; currency: CurrencyCode; credits: Acc; chargebacks: Acc }): AgingRow => {
    const net = emptyAcc();
    for (const b of AGING_BUCKETS) {
      net.amounts[b] = r.credits.amounts[b] + r.chargebacks.amounts[b];
      net.counts[b] = r.credits.counts[b] + r.chargebacks.counts[b];
    }
    return { dealerId: r.dealerId, currency: r.currency, credits: toTotals(r.credits), chargebacks: toTotals(r.chargebacks), net: toTotals(net) };
  };
  const order = (a: AgingRow, b: AgingRow) =>
    a.dealerId < b.dealerId ? -1 : a.dealerId > b.dealerId ? 1 : a.currency < b.currency ? -1 : a.currency > b.currency ? 1 : 0;
  return { asOf, rows: [...rows.values()].map(finish).sort(order), totals: [...totals.values()].map(finish).sort(order) };
}

function toTotals(acc: Acc): BucketTotals {
  const amounts = {} as Record<AgingBucket, MinorUnits>;
  let total = 0n;
  let count = 0;
  for (const b of AGING_BUCKETS) {
    amounts[b] = fromBigInt(acc.amounts[b], `aging ${b}`);
    total += acc.amounts[b];
    count += acc.counts[b];
  }
  return { amounts, counts: { ...acc.counts }, totalMinor: fromBigInt(total, 'aging total'), count };
}
