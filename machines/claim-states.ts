import type { ChargebackReason } from './claim-context';
import type {
  ClaimEventType,
  CoreCondition,
  DenialReason,
  InspectionResult,
  WaiverReason,
} from './claim-events';

export const STAGES = [
  'draft',
  'submitted',
  'in_review',
  'waiting_on_dealer',
  'denied',
  'appealed',
  'withdrawn',
  'approved',
  'credit_pending',
  'credited',
  'reconciled',
] as const;
export type Stage = (typeof STAGES)[number];

export const REPLACEMENT_STATES = ['to_ship', 'from_shop_stock', 'shipped', 'fitted', 'verified'] as const;
export type ReplacementState = (typeof REPLACEMENT_STATES)[number];

export const CORE_STATES = ['requested', 'in_transit', 'received', 'inspected', 'waived', 'written_off'] as const;
export type CoreState = (typeof CORE_STATES)[number];

/** The state value as xstate reports it and as it is stored (jsonb). */
export type ClaimStateValue =
  | Exclude<Stage, 'approved'>
  | { approved: { replacement: ReplacementState; core: CoreState } };

export const STAGE_LABELS: Record<Stage, string> = {
  draft: 'Draft',
  submitted: 'Submitted',
  in_review: 'In review',
  waiting_on_dealer: 'Waiting on dealer',
  denied: 'Denied',
  appealed: 'Appealed',
  withdrawn: 'Withdrawn',
  approved: 'Approved',
  credit_pending: 'Credit pending',
  credited: 'Credited',
  reconciled: 'Reconciled',
};

export const REPLACEMENT_LABELS: Record<ReplacementState, string> = {
  to_ship: 'to ship',
  from_shop_stock: 'fitted from shop stock',
  shipped: 'shipped',
  fitted: 'fitted, after-test not passed',
  verified: 'verified',
};

export const CORE_LABELS: Record<CoreState, string> = {
  requested: 'core requested',
  in_transit: 'core in transit',
  received: 'core received',
  inspected: 'core inspected',
  waived: 'core waived',
  written_off: 'core written off',
};

/** `action` is a button's wording; `done` is the timeline's wording once the step has happened. */
export const EVENT_LABELS: Record<ClaimEventType, { action: string; done: string }> = {
  SUBMIT: { action: 'Submit to the brand', done: 'Submitted to the brand' },
  WITHDRAW: { action: 'Withdraw the claim', done: 'Withdrawn by the dealer' },
  TAKE: { action: 'Take for review', done: 'Taken for review' },
  RELEASE: { action: 'Release to the queue', done: 'Released to the queue' },
  REQUEST_INFO: { action: 'Ask the dealer for more', done: 'Dealer asked for more' },
  RESUBMIT: { action: 'Send the requested items', done: 'Requested items sent' },
  APPROVE: { action: 'Approve', done: 'Approved' },
  DENY: { action: 'Deny', done: 'Denied' },
  APPEAL: { action: 'Appeal the denial', done: 'Denial appealed' },
  SHIP: { action: 'Ship the replacement', done: 'Replacement shipped' },
  MARK_FITTED: { action: 'Mark fitted, with the after-test', done: 'Replacement fitted' },
  SUBMIT_AFTER_TEST: { action: 'Upload a new after-test', done: 'New after-test uploaded' },
  ACCEPT_BY_HAND: { action: 'Accept the after-test by hand', done: 'After-test accepted by hand' },
  ISSUE_RETURN_LABEL: { action: 'Issue the core return label', done: 'Core return label issued' },
  REMIND_CORE: { action: 'Remind the dealer about the core', done: 'Core return reminder sent' },
  CORE_SHIPPED: { action: 'Mark the core shipped', done: 'Core shipped back' },
  CORE_RECEIVED: { action: 'Receive the core', done: 'Core received' },
  INSPECT: { action: 'Record the core inspection', done: 'Core inspected' },
  WAIVE_CORE: { action: 'Waive the core return', done: 'Core return waived' },
  WRITE_OFF_CORE: { action: 'Write off the core', done: 'Core written off as not returned' },
  ISSUE_CREDIT: { action: 'Issue the credit memo', done: 'Credit memo issued' },
  RECONCILE: { action: 'Reconcile with the statement', done: "Reconciled with the dealer's statement" },
};

export const DENIAL_REASON_LABELS: Record<DenialReason, string> = {
  out_of_coverage: 'Outside the warranty period or coverage',
  unregistered_no_proof: 'Not registered and no proof of purchase',
  modification_or_tampering: 'Modified or tampered with',
  crash_or_impact: 'Crash or impact damage',
  water_ingress: 'Water got in',
  wear_item: 'Normal wear',
  insufficient_evidence: 'Not enough evidence of the fault',
  not_our_part: 'Not a part of this brand',
};

export const INSPECTION_RESULT_LABELS: Record<InspectionResult, string> = {
  fault_confirmed: 'Fault confirmed',
  no_fault_found: 'No fault found',
  not_covered: 'Damage not covered',
};

export const WAIVER_REASON_LABELS: Record<WaiverReason, string> = {
  local_recycling: 'Recycled locally (photo proof)',
  scrapped_at_shop: 'Scrapped at the shop (photo proof)',
};

export const CORE_CONDITION_LABELS: Record<CoreCondition, string> = {
  sound: 'Arrived as described',
  transit_damage: 'Damaged in transit',
  incomplete: 'Parts missing',
};

export const CHARGEBACK_REASON_LABELS: Record<ChargebackReason, string> = {
  no_fault_found: 'No fault found on the returned core',
  not_covered: 'Damage on the core is not covered',
  core_not_returned: 'Core not returned in time',
};

export interface ClaimStateDescription {
  /** One short key for indexing; `approved` for the whole parallel stage. */
  stage: Stage;
  replacement?: ReplacementState;
  core?: CoreState;
  label: string;
}

function isOneOf<T extends string>(list: readonly T[], value: unknown): value is T {
  return typeof value === 'string' && (list as readonly string[]).includes(value);
}

/**
 * Flat description of a state value for storage and display.
 * Throws a TypeError that says what is wrong when the value is not one of this machine's states.
 */
export function describeState(value: unknown): ClaimStateDescription {
  if (typeof value === 'string') {
    if (!isOneOf(STAGES, value)) throw new TypeError(`Unknown claim state "${value}".`);
    if (value === 'approved') {
      throw new TypeError('The approved state needs both tracks: { approved: { replacement, core } }.');
    }
    return { stage: value, label: STAGE_LABELS[value] };
  }
  if (typeof value !== 'object' || value === null || Array.isArray(value)) {
    throw new TypeError('A claim state value must be a state name or { approved: { replacement, core } }.');
  }
  const keys = Object.keys(value);
  if (keys.length !== 1 || keys[0] !== 'approved') {
    throw new TypeError(`Unknown claim state ${JSON.stringify(value)}; only "approved" has tracks.`);
  }
  const tracks = (value as { approved: unknown }).approved;
  if (typeof tracks !== 'object' || tracks === null) {
    throw new TypeError('The approved state needs both tracks: { approved: { replacement, core } }.');
  }
  const { replacement, core } = tracks as { replacement?: unknown; core?: unknown };
  if (!isOneOf(REPLACEMENT_STATES, replacement)) {
    throw new TypeError(`Unknown replacement track state "${String(replacement)}".`);
  }
  if (!isOneOf(CORE_STATES, core)) throw new TypeError(`Unknown core track state "${String(core)}".`);
  return {
    stage: 'approved',
    replacement,
    core,
    label: `${STAGE_LABELS.approved} — ${REPLACEMENT_LABELS[replacement]} / ${CORE_LABELS[core]}`,
  };
}
