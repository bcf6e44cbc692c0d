import { isIsoDate, type IsoDate } from '@/lib/calendar';
import { fromBigInt, isMinorUnits, type CurrencyCode, type MinorUnits } from '@/lib/money';
import { ReportInputError } from './report-input-error';

/**
 * settlement_cash     — credits paid to dealers (positive); a chargeback recovered is negative;
 * settlement_in_kind  — replacement parts shipped, at cost (positive);
 * accrual             — liability recorded for warranties issued in the period (not negative);
 * change_in_estimate  — revision of the liability for earlier warranties, either sign (expirations are negative).
 */
export type LiabilityMovementKind = 'settlement_cash' | 'settlement_in_kind' | 'accrual' | 'change_in_estimate';

export interface LiabilityMovement {
  date: IsoDate;
  kind: LiabilityMovementKind;
  amountMinor: MinorUnits;
  note?: string;
}

export interface RollForwardInput {
  currency: CurrencyCode;
  periodStart: IsoDate;
  periodEnd: IsoDate;
  beginningBalanceMinor: MinorUnits;
  movements: readonly LiabilityMovement[];
}

export interface RollForwardLine {
  label: string;
  /** Signed as presented: settlements negative, accruals positive. */
  amountMinor: MinorUnits;
}

export interface RollForward {
  currency: CurrencyCode;
  periodStart: IsoDate;
  periodEnd: IsoDate;
  beginningBalanceMinor: MinorUnits;
  settlementsInCashMinor: MinorUnits;
  settlementsInKindMinor: MinorUnits;
  accrualsMinor: MinorUnits;
  changesInEstimateMinor: MinorUnits;
  endingBalanceMinor: MinorUnits;
  /** The table in the order of the US GAAP disclosure, ASC 460-10-50-8(c). */
  lines: RollForwardLine[];
}

/**
 * The product-warranty liability roll-forward for a period, in the presentation of
 * ASC 460-10-50-8(c): beginning balance − settlements (in cash or in kind) + accruals for
 * warranties issued in the period ± changes in estimate = ending balance. Exact. Every movement
 * must fall inside the period.
 */
export function liabilityRollForward(input: RollForwardInput): RollForward {
  const { periodStart, periodEnd } = input;
  if (!isIsoDate(periodStart)) throw new ReportInputError(`periodStart: ${JSON.stringify(periodStart)} is not a date YYYY-MM-DD`);
  if (!isIsoDate(periodEnd)) throw new ReportInputError(`periodEnd: ${JSON.stringify(periodEnd)} is not a date YYYY-MM-DD`);
  if (periodEnd < periodStart) throw new ReportInputError(`periodEnd ${periodEnd} is before periodStart ${periodStart}`);
  if (!isMinorUnits(input.beginningBalanceMinor)) throw new ReportInputError('beginningBalanceMinor: must be a whole number of minor units');

  const sums: Record<LiabilityMovementKind, bigint> = { settlement_cash: 0n, settlement_in_kind: 0n, accrual: 0n, change_in_estimate: 0n };
  input.movements.forEach((m, i) => {
    const where = `movements[${i}]`;
    if (!(m.kind in sums)) throw new ReportInputError(`${where}.kind: ${JSON.stringify(m.kind)} is not a liability movement`);
    if (!isMinorUnits(m.amountMinor)) throw new ReportInputError(`${where}.amountMinor: must be a whole number of minor units`);
    if (!isIsoDate(m.date)) throw new ReportInputError(`${where}.date: ${JSON.stringify(m.date)} is not a date YYYY-MM-DD`);
    if (m.date < periodStart || m.date > periodEnd) {
      throw new ReportInputError(`${where}.date: ${m.date} is outside the period ${periodStart} – ${periodEnd}`);
    }
    if (m.kind === 'accrual' && m.amountMinor < 0) {
      throw new ReportInputError(`${where}.amountMinor: an accrual is not negative; record a reduction as a change in estimate`);
    }
    if (m.kind === 'settlement_in_kind' && m.amountMinor < 0) {
      throw new ReportInputError(`${where}.amountMinor: a settlement in kind (parts shipped at cost) is not negative`);
    }
    sums[m.kind] += BigInt(m.amountMinor);
  });

  const beginning = BigInt(input.beginningBalanceMinor);
  const ending = beginning - sums.settlement_cash - sums.settlement_in_kind + sums.accrual + sums.change_in_estimate;
  const n = (v: bigint, what: string) => fromBigInt(v, what);
  return {
    currency: input.currency,
    periodStart,
    periodEnd,
    beginningBalanceMinor: input.beginningBalanceMinor,
    settlementsInCashMinor: n(sums.settlement_cash, 'settlements in cash'),
    settlementsInKindMinor: n(sums.settlement_in_kind, 'settlements in kind'),
    accrualsMinor: n(sums.accrual, 'accruals'),
    changesInEstimateMinor: n(sums.change_in_estimate, 'changes in estimate'),
    endingBalanceMinor: n(ending, 'ending balance'),
    lines: [
      { label: 'Warranty liability at the start of the period', amountMinor: input.beginningBalanceMinor },
      { label: 'Settled by credits to dealers', amountMinor: n(-sums.settlement_cash, 'settlements in cash') },
      { label: 'Settled by replacement parts shipped (at cost)', amountMinor: n(-sums.settlement_in_kind, 'settlements in kind') },
      { label: 'Accrued for warranties issued in the period', amountMinor: n(sums.accrual, 'accruals') },
      { label: 'Changes in estimate for earlier warranties', amountMinor: n(sums.change_in_estimate, 'changes in estimate') },
      { label: 'Warranty liability at the end of the period', amountMinor: n(ending, 'ending balance') },
    ],
  };
}
