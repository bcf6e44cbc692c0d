import type { IsoDate } from '@/lib/calendar';
import { sumMinor, type CurrencyCode, type MinorUnits } from '@/lib/money';
import type {
  ApprovedPart,
  ChargebackReason,
  ChargebackRequest,
  CreditInput,
  CreditLine,
  LaborOperation,
  LaborRates,
  LaborRelease,
  PriceListEntry,
} from './types';

/** A claim's request lines as the claim stores them (requested, or as approved by the rep). */
export interface ClaimLines {
  parts: { lineId: string; partNumber: string; name: string; quantity: number; fromDealerStock: boolean }[];
  labor: { lineId: string; code: string; description: string; hours: string }[];
  freightMinor: number;
}

/** What the claim lifecycle records that decides the credit. */
export interface ClaimForCredit {
  currency: CurrencyCode;
  requested: ClaimLines;
  /** The approved quantities and hours, when the review recorded them line by line. */
  approved: ClaimLines | null;
  /** The machine's verdict per requested line (APPROVE), used when `approved` is not recorded. */
  approvalFlags: { lineId: string; approved: boolean }[];
  afterTest: { outcome: 'none' | 'failed' | 'passed' | 'accepted_by_hand'; acceptedReason: string | null };
  /** The machine's chargeback reasons (from the core's outcome). */
  chargebackReasons: readonly string[];
  inspectionNotes: string | null;
  /** The date the price list is read on: the day the replacement was fitted. */
  priceDate: IsoDate;
  laborRates: LaborRates;
}

export interface CreditCatalog {
  /** Part number → catalog category. */
  partCategories: Record<string, string>;
  /** Labor operation code → standard hours from the brand's schedule ("1.20"). */
  scheduledHours: Record<string, string>;
  /** Every price of the claim's parts, all dates (the price in force is picked by date). */
  priceList: PriceListEntry[];
}

/** The machine names "not covered" shorter than the credit rules do. */
const CHARGEBACK_OF_MACHINE: Record<string, ChargebackReason> = {
  no_fault_found: 'no_fault_found',
  not_covered: 'not_covered_at_inspection',
  core_not_returned: 'core_not_returned',
};

export function laborReleaseOf(afterTest: ClaimForCredit['afterTest']): LaborRelease {
  if (afterTest.outcome === 'passed') return { state: 'verified_by_test' };
  if (afterTest.outcome === 'accepted_by_hand') return { state: 'accepted_by_rep', reason: afterTest.acceptedReason?.trim() || 'accepted by the rep' };
  return { state: 'not_verified', reason: afterTest.outcome === 'failed' ? 'the after-test did not pass' : 'no after-test yet' };
}

export function chargebackOf(reasons: readonly string[], note: string | null): ChargebackRequest | undefined {
  const reason = reasons.map((r) => CHARGEBACK_OF_MACHINE[r]).find((r) => r !== undefined);
  if (!reason) return undefined;
  return note?.trim() ? { reason, note: note.trim() } : { reason };
}

/**
 * The approved parts, labor and freight of a claim. When the review recorded approved lines
 * (quantities and hours), those are what is approved and a requested line missing from them is
 * approved at 0. Otherwise the machine's per-line verdicts apply: an approved line in full, a
 * refused one at 0; freight follows a line "freight" when there is one, else it is approved.
 */
export function approvedLinesOf(claim: Pick<ClaimForCredit, 'requested' | 'approved' | 'approvalFlags'>): {
  parts: { line: ClaimLines['parts'][number]; approvedQuantity: number; fromDealerStock: boolean }[];
  labor: { line: ClaimLines['labor'][number]; approvedHours: string }[];
  freightMinor: number;
} {
  const { requested, approved } = claim;
  if (approved) {
    return {
      parts: requested.parts.map((p) => {
        const a = approved.parts.find((x) => x.lineId === p.lineId);
        return { line: p, approvedQuantity: a?.quantity ?? 0, fromDealerStock: a?.fromDealerStock ?? p.fromDealerStock };
      }),
      labor: requested.labor.map((l) => ({ line: l, approvedHours: approved.labor.find((x) => x.lineId === l.lineId)?.hours ?? '0' })),
      freightMinor: approved.freightMinor,
    };
  }
  const flag = (lineId: string) => claim.approvalFlags.find((f) => f.lineId === lineId)?.approved;
  return {
    parts: requested.parts.map((p) => ({ line: p, approvedQuantity: flag(p.lineId) ? p.quantity : 0, fromDealerStock: p.fromDealerStock })),
    labor: requested.labor.map((l) => ({ line: l, approvedHours: flag(l.lineId) ? l.hours : '0' })),
    freightMinor: flag('freight') === false ? 0 : requested.freightMinor,
  };
}

/** The input of `computeCredit` for a claim whose replacement and core tracks are done. */
export function creditInputFromClaim(claim: ClaimForCredit, catalog: CreditCatalog): CreditInput {
  const approved = approvedLinesOf(claim);
  const parts: ApprovedPart[] = approved.parts.map(({ line, approvedQuantity, fromDealerStock }) => ({
    partNumber: line.partNumber,
    description: line.name,
    category: catalog.partCategories[line.partNumber] ?? 'other',
    requestedQuantity: line.quantity,
    approvedQuantity,
    source: fromDealerStock ? 'dealer_stock' : 'brand_shipped',
  }));
  const labor: LaborOperation[] = approved.labor.map(({ line, approvedHours }) => {
    const scheduled = catalog.scheduledHours[line.code] ?? line.hours;
    return {
      code: line.code,
      description: line.description,
      scheduledHours: scheduled,
      requestedHours: line.hours,
      approvedHours,
    };
  });
  const chargeback = chargebackOf(claim.chargebackReasons, claim.inspectionNotes);
  return {
    currency: claim.currency,
    priceDate: claim.priceDate,
    priceList: catalog.priceList,
    parts,
    labor,
    laborRates: claim.laborRates,
    laborRelease: laborReleaseOf(claim.afterTest),
    freight: { approvedMinor: approved.freightMinor, requestedMinor: claim.requested.freightMinor, description: 'Freight allowance' },
    ...(chargeback ? { chargeback } : {}),
  };
}

/**
 * Labor still credited on a claim across its memos: labor lines (reversals count negatively
 * through their negated lines) less labor already taken back by a chargeback.
 */
export function netLaborCredited(lines: readonly Pick<CreditLine, 'kind' | 'amountMinor' | 'basis'>[]): MinorUnits {
  return sumMinor(lines.filter((l) => l.kind === 'labor' || l.basis.kind === 'chargeback_labor').map((l) => l.amountMinor));
}
