import { isIsoDate, type IsoDate } from '@/lib/calendar';
import type { CreditLine } from '@/lib/credits';
import { fromBigInt, isMinorUnits, type CurrencyCode, type MinorUnits } from '@/lib/money';
import { ReportInputError } from './report-input-error';

export interface MemoForCostReport {
  number: string;
  issuedOn: IsoDate;
  currency: CurrencyCode;
  /** The claim's failed part: labor, freight and labor chargebacks are attributed to it. */
  claimPart: { partNumber: string; category: string };
  lines: Pick<CreditLine, 'kind' | 'amountMinor' | 'partNumber' | 'category'>[];
}

/** A replacement part the brand shipped, at the brand's own cost (a settlement in kind). */
export interface ShipmentAtCost {
  rmaNumber: string;
  shippedOn: IsoDate;
  currency: CurrencyCode;
  partNumber: string;
  category: string;
  quantity: number;
  unitCostMinor: MinorUnits;
}

export type CostGrouping = 'month' | 'category' | 'part_number';

export interface CostBreakdown {
  partsCreditedMinor: MinorUnits;
  laborMinor: MinorUnits;
  freightMinor: MinorUnits;
  /** Negative: chargebacks reduce the cost. */
  chargebacksMinor: MinorUnits;
  shippedPartsAtCostMinor: MinorUnits;
  totalMinor: MinorUnits;
}

export interface WarrantyCostRow extends CostBreakdown {
  /** yyyy-mm, the category, or the part number. */
  key: string;
}

export interface WarrantyCostReport {
  currency: CurrencyCode;
  groupBy: CostGrouping;
  rows: WarrantyCostRow[];
  totals: CostBreakdown;
}

export interface WarrantyCostInput {
  currency: CurrencyCode;
  memos: readonly MemoForCostReport[];
  shipments: readonly ShipmentAtCost[];
  /** Inclusive period; memos by issue date, shipments by ship date. Both optional. */
  from?: IsoDate;
  to?: IsoDate;
}

type Column = Exclude<keyof CostBreakdown, 'totalMinor'>;
const COLUMNS: readonly Column[] = ['partsCreditedMinor', 'laborMinor', 'freightMinor', 'chargebacksMinor', 'shippedPartsAtCostMinor'];
const COLUMN_OF_KIND: Record<CreditLine['kind'], Column> = {
  part: 'partsCreditedMinor',
  labor: 'laborMinor',
  freight: 'freightMinor',
  chargeback: 'chargebacksMinor',
};

/**
 * Warranty cost = credit memo lines (parts credited, labor, freight, chargebacks; reversals count
 * negatively through their lines) + replacement parts shipped, at the brand's cost. Grouped by
 * month (ISO yyyy-mm of the memo's issue date or the ship date), part category or part number.
 * A line without its own part is attributed to the claim's failed part. One currency per report.
 */
export function warrantyCost(input: WarrantyCostInput, groupBy: CostGrouping): WarrantyCostReport {
  const { currency, from, to } = input;
  if (from !== undefined && !isIsoDate(from)) throw new ReportInputError(`from: ${JSON.stringify(from)} is not a date YYYY-MM-DD`);
  if (to !== undefined && !isIsoDate(to)) throw new ReportInputError(`to: ${JSON.stringify(to)} is not a date YYYY-MM-DD`);
  const inPeriod = (d: IsoDate) => (from === undefined || d >= from) && (to === undefined || d <= to);
  const groups = new Map<string, Record<Column, bigint>>();
  const add = (key: string, column: Column, amount: bigint) => {
    let g = groups.get(key);
    if (!g) groups.set(key, (g = { partsCreditedMinor: 0n, laborMinor: 0n, freightMinor: 0n, chargebacksMinor: 0n, shippedPartsAtCostMinor: 0n }));
    g[column] += amount;
  };
  const keyOf = (date: IsoDate, part: { partNumber: string; category: string }) =>
    groupBy === 'month' ? date.slice(0, 7) : groupBy === 'category' ? part.category : part.partNumber;

  for (const memo of input.memos) {
    const where = `memo ${memo.number}`;
    if (memo.currency !== currency) throw new ReportInputError(`${where}: in ${memo.currency}, but the report is in ${currency}`);
    if (!isIsoDate(memo.issuedOn)) throw new ReportInputError(`${where}: issuedOn ${JSON.stringify(memo.issuedOn)} is not YYYY-MM-DD`);
    if (!inPeriod(memo.issuedOn)) continue;
    memo.lines.forEach((line, i) => {
      if (!isMinorUnits(line.amountMinor)) throw new ReportInputError(`${where} line ${i + 1}: amountMinor must be a whole number of minor units`);
      const part =
        line.partNumber !== undefined && line.category !== undefined ? { partNumber: line.partNumber, category: line.category } : memo.claimPart;
      add(keyOf(memo.issuedOn, part), COLUMN_OF_KIND[line.kind], BigInt(line.amountMinor));
    });
  }
  for (const s of input.shipments) {
    const where = `shipment ${s.rmaNumber} ${s.partNumber}`;
    if (s.currency !== currency) throw new ReportInputError(`${where}: in ${s.currency}, but the report is in ${currency}`);
    if (!isIsoDate(s.shippedOn)) throw new ReportInputError(`${where}: shippedOn ${JSON.stringify(s.shippedOn)} is not YYYY-MM-DD`);
    if (!Number.isSafeInteger(s.quantity) || s.quantity < 1) throw new ReportInputError(`${where}: quantity must be a whole number from 1`);
    if (!isMinorUnits(s.unitCostMinor) || s.unitCostMinor < 0) throw new ReportInputError(`${where}: unitCostMinor must be whole minor units, not negative`);
    if (!inPeriod(s.shippedOn)) continue;
    add(keyOf(s.shippedOn, s), 'shippedPartsAtCostMinor', BigInt(s.unitCostMinor) * BigInt(s.quantity));
  }

  const sum: Record<Column, bigint> = { partsCreditedMinor: 0n, laborMinor: 0n, freightMinor: 0n, chargebacksMinor: 0n, shippedPartsAtCostMinor: 0n };
  const rows = [...groups.entries()]
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))
    .map(([key, g]) => {
      for (const c of COLUMNS) sum[c] += g[c];
      return { key, ...breakdown(g) };
    });
  return { currency, groupBy, rows, totals: breakdown(sum) };
}

function breakdown(g: Record<Column, bigint>): CostBreakdown {
  let total = 0n;
  const out = {} as CostBreakdown;
  for (const c of COLUMNS) {
    out[c] = fromBigInt(g[c], c);
    total += g[c];
  }
  out.totalMinor = fromBigInt(total, 'totalMinor');
  return out;
}
