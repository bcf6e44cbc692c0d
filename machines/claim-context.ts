import type { EvidenceSummary } from '@/lib/claims/evidence';
import type {
  Actor,
  ApprovalLine,
  CoreCondition,
  DenialReason,
  InspectionResult,
  WaiverReason,
} from './claim-events';

/** Why a credit will carry a chargeback line; read later by the credit computation. */
export const CHARGEBACK_REASONS = ['no_fault_found', 'not_covered', 'core_not_returned'] as const;
export type ChargebackReason = (typeof CHARGEBACK_REASONS)[number];

export interface ClaimDecision {
  outcome: 'full' | 'partial' | 'denied';
  reasonCode: DenialReason | null;
  message: string | null;
  at: string;
  by: string;
}

export interface InfoRequests {
  count: number;
  lastChecklist: string[];
  lastMessage: string | null;
  lastAt: string | null;
  lastBy: string | null;
}

export interface AfterTestRecord {
  /** `none` until the dealer marks the replacement fitted. */
  outcome: 'none' | 'failed' | 'passed' | 'accepted_by_hand';
  attempts: number;
  lastTestId: string | null;
  acceptedReason: string | null;
  acceptedBy: string | null;
  settledAt: string | null;
}

export interface ReplacementRecord {
  /** Nothing for the brand to ship: every approved part came from the dealer's shelf, or none was approved (absent on older claims: false). */
  fromShopStock?: boolean;
  carrier: string | null;
  trackingNumber: string | null;
  shippedAt: string | null;
  shippedBy: string | null;
  fittedAt: string | null;
}

export interface CoreRecord {
  /** `open` while the return is under way; the other values are the track's final outcomes. */
  outcome: 'open' | 'inspected' | 'waived' | 'written_off';
  labelRef: string | null;
  dangerousGoods: boolean | null;
  remindersSent: number;
  lastReminderAt: string | null;
  carrier: string | null;
  trackingNumber: string | null;
  shippedAt: string | null;
  receivedAt: string | null;
  receivedBy: string | null;
  condition: CoreCondition | null;
  conditionNotes: string | null;
  inspection: { result: InspectionResult; notes: string | null; at: string; by: string } | null;
  waiver: { reason: WaiverReason; proofAttachmentId: string; at: string; by: string } | null;
  writtenOffAt: string | null;
}

/** Everything the lifecycle remembers; JSON-safe (no undefined, no Date) because it is stored as jsonb. */
export interface ClaimContext {
  openedBy: Actor;
  openedAt: string;
  lastStepAt: string;
  submittedAt: string | null;
  evidence: EvidenceSummary | null;
  assignedRepId: string | null;
  deniedByRepId: string | null;
  appealsUsed: number;
  appealOpenUntil: string | null;
  appealMessage: string | null;
  infoRequests: InfoRequests;
  decision: ClaimDecision | null;
  approvedLines: ApprovalLine[];
  rmaNumber: string | null;
  withdrawal: { at: string; by: string; note: string | null } | null;
  replacement: ReplacementRecord;
  afterTest: AfterTestRecord;
  core: CoreRecord;
  chargebackReasons: ChargebackReason[];
  creditMemoId: string | null;
  creditedAt: string | null;
  statementLineRef: string | null;
  reconciledAt: string | null;
}

export interface ClaimInput {
  /** The dealer user who opened the draft. */
  openedBy: Actor;
  openedAt: string;
}

export function initialClaimContext(input: ClaimInput): ClaimContext {
  return {
    openedBy: { id: input.openedBy.id, role: input.openedBy.role },
    openedAt: input.openedAt,
    lastStepAt: input.openedAt,
    submittedAt: null,
    evidence: null,
    assignedRepId: null,
    deniedByRepId: null,
    appealsUsed: 0,
    appealOpenUntil: null,
    appealMessage: null,
    infoRequests: { count: 0, lastChecklist: [], lastMessage: null, lastAt: null, lastBy: null },
    decision: null,
    approvedLines: [],
    rmaNumber: null,
    withdrawal: null,
    replacement: { carrier: null, trackingNumber: null, shippedAt: null, shippedBy: null, fittedAt: null },
    afterTest: {
      outcome: 'none',
      attempts: 0,
      lastTestId: null,
      acceptedReason: null,
      acceptedBy: null,
      settledAt: null,
    },
    core: {
      outcome: 'open',
      labelRef: null,
      dangerousGoods: null,
      remindersSent: 0,
      lastReminderAt: null,
      carrier: null,
      trackingNumber: null,
      shippedAt: null,
      receivedAt: null,
      receivedBy: null,
      condition: null,
      conditionNotes: null,
      inspection: null,
      waiver: null,
      writtenOffAt: null,
    },
    chargebackReasons: [],
    creditMemoId: null,
    creditedAt: null,
    statementLineRef: null,
    reconciledAt: null,
  };
}

/** The chargebacks a core outcome leads to. A waived core or a confirmed fault leads to none. */
export function chargebackReasonsFor(core: Pick<CoreRecord, 'outcome' | 'inspection'>): ChargebackReason[] {
  if (core.outcome === 'written_off') return ['core_not_returned'];
  if (core.outcome === 'inspected' && core.inspection) {
    if (core.inspection.result === 'no_fault_found') return ['no_fault_found'];
    if (core.inspection.result === 'not_covered') return ['not_covered'];
  }
  return [];
}
