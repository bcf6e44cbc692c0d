import type { IsoDate } from '@/lib/calendar';
import type { CurrencyCode, MinorUnits } from '@/lib/money';

/** Where the fitted replacement part came from. */
export type PartSource = 'dealer_stock' | 'brand_shipped';

export interface ApprovedPart {
  partNumber: string;
  description: string;
  /** The catalog's part category (motor, battery, controller, display, …). */
  category: string;
  requestedQuantity: number;
  /** 0 … requestedQuantity; less than requested is a partial approval. */
  approvedQuantity: number;
  source: PartSource;
}

/** One row of the brand's dealer price list: the dealer net price from a date on. */
export interface PriceListEntry {
  partNumber: string;
  dealerNetMinor: MinorUnits;
  effectiveFrom: IsoDate;
}

export interface LaborOperation {
  /** Operation code from the brand's labor-time schedule. */
  code: string;
  description: string;
  /** Standard hours from the schedule, decimal string ("1.25"). */
  scheduledHours: string;
  /** What the dealer asked for, when it differs from the schedule. */
  requestedHours?: string;
  /** What the rep approved; this is what is paid. */
  approvedHours: string;
}

export interface LaborRates {
  /** The dealer's agreed labor rate, minor units per hour. */
  dealerRateMinor: MinorUnits;
  /** The brand's maximum labor rate, minor units per hour. */
  brandMaxRateMinor: MinorUnits;
}

/** Whether the repair is proven, which releases the labor credit. */
export type LaborRelease =
  | { state: 'verified_by_test' }
  | { state: 'accepted_by_rep'; reason: string }
  | { state: 'not_verified'; reason?: string };

export interface FreightAllowance {
  approvedMinor: MinorUnits;
  requestedMinor?: MinorUnits;
  description?: string;
}

export type ChargebackReason = 'no_fault_found' | 'core_not_returned' | 'not_covered_at_inspection';

export interface ChargebackRequest {
  reason: ChargebackReason;
  /** Which parts (and how many) are charged back; default: every approved part in full. */
  parts?: { partNumber: string; quantity: number }[];
  note?: string;
}

interface CreditInputBase {
  currency: CurrencyCode;
  /** The date the price list is read on (the repair date). */
  priceDate: IsoDate;
  priceList: PriceListEntry[];
  parts: ApprovedPart[];
}

export interface CreditInput extends CreditInputBase {
  labor: LaborOperation[];
  laborRates: LaborRates;
  laborRelease: LaborRelease;
  freight?: FreightAllowance;
  /** A chargeback known when the memo is issued (e.g. no fault found at inspection). */
  chargeback?: ChargebackRequest;
  /** Labor credited on earlier memos of this claim, also taken back by a labor-reversing chargeback. */
  priorLaborCreditedMinor?: MinorUnits;
}

/** A chargeback on a claim whose credit memo was already issued. */
export interface ChargebackInput extends CreditInputBase {
  chargeback: ChargebackRequest;
  /** Labor credited on this claim's earlier memos. */
  laborCreditedMinor: MinorUnits;
  /** Those memos' numbers, shown in the basis. */
  creditedOnMemos?: string[];
}

export type CreditLineKind = 'part' | 'labor' | 'freight' | 'chargeback';

/**
 * credited     — counts in the total;
 * withheld     — labor waiting on a verified repair: amount 0, the basis says what will be released;
 * not_credited — nothing is owed on this line (part shipped by the brand, nothing approved): amount 0;
 * charged_back — a negative line.
 */
export type CreditLineStatus = 'credited' | 'withheld' | 'not_credited' | 'charged_back';

export type LineBasis =
  | {
      kind: 'part_at_dealer_net';
      partNumber: string;
      quantity: number;
      requestedQuantity: number;
      unitPriceMinor: MinorUnits;
      priceListEffectiveFrom: IsoDate;
    }
  | { kind: 'part_shipped_by_brand'; partNumber: string; quantity: number; requestedQuantity: number }
  | { kind: 'part_not_approved'; partNumber: string; requestedQuantity: number }
  | {
      kind: 'labor';
      operationCode: string;
      approvedHours: string;
      scheduledHours: string;
      requestedHours?: string;
      dealerRateMinor: MinorUnits;
      brandMaxRateMinor: MinorUnits;
      rateAppliedMinor: MinorUnits;
      capApplied: boolean;
      /** approved hours × rate before rounding, in minor units ("937.5"). */
      exactMinor: string;
      release: LaborRelease;
      /** Set when withheld: the amount the verified repair will release. */
      withheldMinor?: MinorUnits;
    }
  | { kind: 'freight'; approvedMinor: MinorUnits; requestedMinor?: MinorUnits }
  | {
      kind: 'chargeback_part';
      reason: ChargebackReason;
      partNumber: string;
      quantity: number;
      source: PartSource;
      unitPriceMinor: MinorUnits;
      priceListEffectiveFrom: IsoDate;
      note?: string;
    }
  | {
      kind: 'chargeback_labor';
      reason: ChargebackReason;
      laborCreditedMinor: MinorUnits;
      creditedOnMemos: string[];
      note?: string;
    };

/** An accountant's edit, recorded against the value the rules computed. */
export interface LineAdjustment {
  fromMinor: MinorUnits;
  toMinor: MinorUnits;
  /** toMinor − the line's computedMinor. */
  deltaMinor: MinorUnits;
  reason: string;
  by: string;
  at: string;
}

export interface CreditLine {
  lineNo: number;
  kind: CreditLineKind;
  status: CreditLineStatus;
  description: string;
  partNumber?: string;
  category?: string;
  laborCode?: string;
  /** What the rules computed (rounded). */
  computedMinor: MinorUnits;
  /** What the memo posts: computedMinor, or the last adjustment. */
  amountMinor: MinorUnits;
  basis: LineBasis;
  adjustments: LineAdjustment[];
  /** On a reversal memo: the line of the reversed memo this one negates. */
  reversesLineNo?: number;
}

export type CreditMemoKind = 'claim' | 'chargeback' | 'reversal';

export interface CreditMemoDraft {
  kind: CreditMemoKind;
  currency: CurrencyCode;
  lines: CreditLine[];
  /** The sum of the lines' amountMinor, each already rounded. */
  totalMinor: MinorUnits;
  reversal?: { reversesMemoNumber: string; reason: string };
}
