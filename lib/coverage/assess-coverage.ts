import { toDayNumber, type IsoDate } from '@/lib/calendar';
import { coveragePeriod } from './coverage-period';
import { CoverageInputError } from './input-error';
import { EXCLUSION_LABELS, type CoveragePolicy, type ExclusionCode } from './policy';
import { coverageInputSchema, parseOrThrow } from './schema';

export interface CoverageInput {
  policy: CoveragePolicy;
  /** Retail sale date, or null when not known. */
  saleDate: IsoDate | null;
  failureDate: IsoDate;
  /** A proof of purchase is on file. */
  proofOfPurchase: boolean;
  /** The bike is registered with the brand (registration carries the sale date). */
  registered: boolean;
  /** Battery only: charge cycles read from the battery. */
  batteryCycles?: number;
  /** Battery only: measured capacity as % of rated (from the capacity test). */
  measuredCapacityPct?: number;
  /** Battery only: what is claimed; defaults to 'capacity_loss' when a capacity is given, else 'other'. */
  batteryFault?: 'capacity_loss' | 'other';
  /** Exclusions the rep or dealer flagged on this claim. */
  flaggedExclusions?: readonly ExclusionCode[];
}

export type ReasonCode = 'sale_date_evidence' | 'coverage_period' | 'battery_cycles' | 'battery_capacity' | 'exclusions' | `exclusion.${ExclusionCode}`;

/** 'open' = cannot be decided yet (something is missing). */
export type ReasonOutcome = 'pass' | 'fail' | 'open';

export interface CoverageReason {
  code: ReasonCode;
  /** True only when the check passed. */
  ok: boolean;
  outcome: ReasonOutcome;
  /** A plain sentence for the rep and the dealer. */
  text: string;
}

export interface CoverageAssessment {
  /** false when any check fails; 'unknown' when none fails but one is open; else true. */
  covered: boolean | 'unknown';
  /** Last covered day (inclusive); null without a sale date. */
  coverageEnds: IsoDate | null;
  /** Whole months from sale to failure; null without a sale date. */
  monthsElapsed: number | null;
  /** Days after the whole months; null without a sale date. */
  daysAfterMonths: number | null;
  reasons: CoverageReason[];
  /** One line: the first failing reason, else the first open one, else "In coverage." */
  summary: string;
}

/** Checks a claim against the brand's policy for the part's category and says why, in plain words. */
export function assessCoverage(input: CoverageInput): CoverageAssessment {
  const i = parseOrThrow(coverageInputSchema, input) as CoverageInput;
  if (i.saleDate !== null && toDayNumber(i.failureDate) < toDayNumber(i.saleDate)) {
    throw new CoverageInputError([
      { field: 'failureDate', message: `${i.failureDate} is before the sale date ${i.saleDate}; a part cannot fail before the bike was sold, so check both dates` },
    ]);
  }
  const { policy } = i;
  const reasons: CoverageReason[] = [];
  const add = (code: ReasonCode, outcome: ReasonOutcome, text: string) => reasons.push({ code, ok: outcome === 'pass', outcome, text });

  add('sale_date_evidence', ...saleDateEvidence(i));

  let coverageEnds: IsoDate | null = null;
  let monthsElapsed: number | null = null;
  let daysAfterMonths: number | null = null;
  if (i.saleDate === null) {
    add('coverage_period', 'open', `No sale date: the ${policy.coverageMonths}-month coverage cannot be checked until the sale date is known.`);
  } else {
    const p = coveragePeriod(i.saleDate, i.failureDate, policy.coverageMonths);
    coverageEnds = p.coverageEnds;
    monthsElapsed = p.monthsElapsed;
    daysAfterMonths = p.daysAfterMonths;
    const head = `Sold ${i.saleDate}; covered for ${plural(policy.coverageMonths, 'month')}, until ${p.coverageEnds} (inclusive); failed ${i.failureDate}, ${elapsedWords(p.monthsElapsed, p.daysAfterMonths)} after sale`;
    if (p.withinPeriod) add('coverage_period', 'pass', `${head}.`);
    else add('coverage_period', 'fail', `${head}: ${plural(p.daysPastEnd, 'day')} after coverage ended.`);
  }

  if (policy.category === 'battery') {
    const cycles = batteryCycleReason(policy, i.batteryCycles);
    if (cycles) add('battery_cycles', ...cycles);
    const capacity = batteryCapacityReason(policy, i.measuredCapacityPct, i.batteryFault ?? (i.measuredCapacityPct !== undefined ? 'capacity_loss' : 'other'));
    if (capacity) add('battery_capacity', ...capacity);
  }

  const flagged = [...new Set(i.flaggedExclusions ?? [])];
  for (const code of flagged) {
    if (policy.exclusions.includes(code)) add(`exclusion.${code}`, 'fail', `Excluded: ${EXCLUSION_LABELS[code]}. The policy does not cover a failure caused by it.`);
    else add(`exclusion.${code}`, 'pass', `Flagged: ${EXCLUSION_LABELS[code]}; this policy does not exclude it, so it does not decide coverage.`);
  }
  if (flagged.length === 0 && policy.exclusions.length > 0) {
    add('exclusions', 'pass', `No exclusion flagged. The policy excludes: ${policy.exclusions.map((c) => EXCLUSION_LABELS[c]).join('; ')}.`);
  }

  const fail = reasons.find((r) => r.outcome === 'fail');
  const open = reasons.find((r) => r.outcome === 'open');
  const covered = fail ? false : open ? 'unknown' : true;
  const summary = fail ? `Not covered. ${fail.text}` : open ? `Coverage not yet known. ${open.text}` : 'In coverage.';
  return { covered, coverageEnds, monthsElapsed, daysAfterMonths, reasons, summary };
}

function saleDateEvidence(i: CoverageInput): [ReasonOutcome, string] {
  if (i.saleDate === null) {
    if (i.proofOfPurchase) return ['open', 'A proof of purchase is on file but no sale date was entered: enter the sale date shown on it.'];
    if (i.registered) return ['open', 'The bike is registered but no sale date came with the registration: take the date from the registration or upload a proof of purchase (needs proof of purchase).'];
    return ['open', 'No sale date and no proof of purchase: needs proof of purchase.'];
  }
  if (i.registered && i.proofOfPurchase) return ['pass', "Sale date from the brand's registration; a proof of purchase is also on file."];
  if (i.registered) return ['pass', "Sale date from the brand's registration."];
  if (i.proofOfPurchase) return ['pass', 'Sale date backed by the proof of purchase on file.'];
  return ['open', `Sale date ${i.saleDate} was entered but is not backed by a registration or a proof of purchase: needs proof of purchase.`];
}

function batteryCycleReason(policy: CoveragePolicy, cycles: number | undefined): [ReasonOutcome, string] | null {
  if (policy.cycleLimit === undefined) return null;
  const limit = policy.cycleLimit;
  if (cycles === undefined) return ['open', `The policy covers up to ${plural(limit, 'charge cycle')}: read the cycle count from the battery and enter it.`];
  if (cycles <= limit) return ['pass', `The battery reports ${plural(cycles, 'charge cycle')}, within the policy's limit of ${limit}.`];
  return ['fail', `The battery reports ${plural(cycles, 'charge cycle')}, over the policy's limit of ${limit}: wear from that much use is not covered.`];
}

// A battery loses capacity as it ages; the policy's threshold separates normal ageing (at or above
// it) from a fault (below it). A low capacity is therefore the claimed fault, not a reason to deny.
function batteryCapacityReason(policy: CoveragePolicy, measured: number | undefined, fault: 'capacity_loss' | 'other'): [ReasonOutcome, string] | null {
  const threshold = policy.capacityThresholdPct;
  if (fault === 'other') {
    if (measured === undefined) return null;
    const ref = threshold === undefined ? '' : ` (policy threshold ${pct(threshold)})`;
    return ['pass', `Measured capacity ${pct(measured)} of rated${ref}; the claimed fault is not capacity loss, so capacity does not decide this claim.`];
  }
  if (threshold === undefined) {
    return ['open', measured === undefined
      ? 'The claim is for capacity loss, but the policy sets no capacity threshold and no capacity was measured: the rep decides on the test.'
      : `Measured capacity ${pct(measured)} of rated; the policy sets no capacity threshold, so the rep decides whether this is a fault.`];
  }
  if (measured === undefined) return ['open', `The claim is for capacity loss: a capacity test is needed to compare with the policy's ${pct(threshold)} threshold.`];
  if (measured < threshold) {
    return ['pass', `Measured capacity ${pct(measured)} of rated, below the policy's ${pct(threshold)} threshold: this capacity loss is the fault being claimed, and it is covered while the battery is within its months${policy.cycleLimit === undefined ? '' : ' and cycles'}.`];
  }
  return ['fail', `Measured capacity ${pct(measured)} of rated, at or above the policy's ${pct(threshold)} threshold: that is normal ageing, not a capacity fault. If the battery fails in another way (will not charge, cuts out), claim that fault instead.`];
}

function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? '' : 's'}`;
}

function elapsedWords(months: number, days: number): string {
  if (months === 0) return plural(days, 'day');
  if (days === 0) return `exactly ${plural(months, 'month')}`;
  return `${plural(months, 'month')} and ${plural(days, 'day')}`;
}

function pct(x: number): string {
  return `${Math.round(x * 100) / 100} %`;
}
