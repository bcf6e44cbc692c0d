import { missingEvidence, type EvidenceSummary } from '@/lib/claims/evidence';
import type { ClaimContext } from './claim-context';
import {
  DEALER_ROLES,
  isClaimEventType,
  payloadProblem,
  stepBaseProblem,
  type Actor,
  type ClaimEvent,
  type ClaimEventType,
  type Role,
} from './claim-events';

/** What is known about a step before its data is filled in: who sends it and, if known, when. */
export interface Standing {
  actor: Actor;
  at?: string;
  noOtherRep?: boolean;
}

interface EventRule {
  roles: readonly Role[];
  /** Who may send it, as it reads after "Only": "the dealer", "a brand rep". */
  who: string;
  /** What it does, as it reads after "can": "submit a claim". */
  does: string;
  /** Refusals that depend on who sends the step and when, not on its data. */
  standing?: (context: ClaimContext, standing: Standing) => string | null;
  /** Refusals on the step's data beyond its shape (run after the schema has passed). */
  data?: (context: ClaimContext, event: ClaimEvent) => string | null;
}

const REP = ['brand_rep'] as const satisfies readonly Role[];

function assignedRepOnly(doesIt: string) {
  return (context: ClaimContext, { actor }: Standing): string | null => {
    if (context.assignedRepId === null) return 'This claim is not assigned to a rep; take it first.';
    if (context.assignedRepId !== actor.id) return `Only the rep assigned to this claim can ${doesIt}.`;
    return null;
  };
}

function time(iso: string): number {
  return Date.parse(iso);
}

function evidenceComplete(_context: ClaimContext, event: ClaimEvent): string | null {
  const evidence = (event as { evidence?: EvidenceSummary }).evidence;
  if (evidence === undefined) return null;
  const missing = missingEvidence(evidence);
  if (missing.length === 0) return null;
  const items = missing.map((m) => m.charAt(0).toLowerCase() + m.slice(1));
  return `This claim cannot go to the brand yet. Missing: ${items.join('; ')}.`;
}

export const EVENT_RULES: Record<ClaimEventType, EventRule> = {
  SUBMIT: { roles: DEALER_ROLES, who: 'the dealer', does: 'submit a claim', data: evidenceComplete },
  WITHDRAW: { roles: DEALER_ROLES, who: 'the dealer', does: 'withdraw a claim' },
  TAKE: {
    roles: REP,
    who: 'a brand rep',
    does: 'take a claim for review',
    standing: (context, { actor, noOtherRep }) =>
      context.appealsUsed > 0 && context.deniedByRepId === actor.id && noOtherRep !== true
        ? 'The rep who denied this claim cannot review its appeal; another rep of the brand must take it.'
        : null,
  },
  RELEASE: {
    roles: REP,
    who: 'a brand rep',
    does: 'release a claim',
    standing: assignedRepOnly('release it'),
  },
  REQUEST_INFO: {
    roles: REP,
    who: 'a brand rep',
    does: 'ask the dealer for more',
    standing: assignedRepOnly('ask the dealer for more'),
  },
  RESUBMIT: { roles: DEALER_ROLES, who: 'the dealer', does: 'resubmit a claim', data: evidenceComplete },
  APPROVE: { roles: REP, who: 'a brand rep', does: 'approve a claim', standing: assignedRepOnly('approve it') },
  DENY: {
    roles: REP,
    who: 'a brand rep',
    does: 'deny a claim',
    standing: assignedRepOnly('deny it'),
    data: (_context, event) =>
      event.type === 'DENY' && time(event.appealOpenUntil) <= time(event.at)
        ? 'The end of the appeal window ("appealOpenUntil") must be after the denial.'
        : null,
  },
  APPEAL: {
    roles: DEALER_ROLES,
    who: 'the dealer',
    does: 'appeal a denial',
    standing: (context, { at }) => {
      if (context.appealsUsed >= 1) return 'A denial can be appealed once; this claim was appealed already.';
      if (context.appealOpenUntil === null) return 'This denial has no appeal window.';
      if (at !== undefined && time(at) > time(context.appealOpenUntil)) {
        return `The appeal window closed on ${context.appealOpenUntil.slice(0, 16).replace('T', ' at ')} UTC.`;
      }
      return null;
    },
  },
  SHIP: { roles: ['warehouse'], who: 'the brand warehouse', does: 'ship the replacement' },
  MARK_FITTED: { roles: DEALER_ROLES, who: 'the dealer', does: 'mark the replacement fitted' },
  SUBMIT_AFTER_TEST: { roles: DEALER_ROLES, who: 'the dealer', does: 'upload an after-test' },
  ACCEPT_BY_HAND: { roles: REP, who: 'a brand rep', does: 'accept an after-test by hand' },
  ISSUE_RETURN_LABEL: { roles: ['warehouse'], who: 'the brand warehouse', does: 'issue a core return label' },
  REMIND_CORE: { roles: ['system'], who: 'the system clock', does: 'send a core return reminder' },
  CORE_SHIPPED: { roles: DEALER_ROLES, who: 'the dealer', does: 'mark the core shipped' },
  CORE_RECEIVED: { roles: ['warehouse'], who: 'the brand warehouse', does: 'receive the core' },
  INSPECT: { roles: ['warehouse'], who: 'the brand warehouse', does: 'inspect the core' },
  WAIVE_CORE: { roles: REP, who: 'a brand rep', does: 'waive the core return' },
  WRITE_OFF_CORE: {
    roles: ['system'],
    who: 'the system clock (at the end of the return period)',
    does: 'write off a core',
    standing: (context, { at }) => {
      if (context.core.lastReminderAt === null) {
        return 'The dealer has not been reminded about the core yet; a core is written off only after a reminder.';
      }
      if (at !== undefined && time(at) <= time(context.core.lastReminderAt)) {
        return 'A core is written off only after the grace period that follows the reminder.';
      }
      return null;
    },
  },
  ISSUE_CREDIT: { roles: ['accountant'], who: 'the brand accountant', does: 'issue a credit memo' },
  RECONCILE: { roles: ['accountant'], who: 'the brand accountant', does: 'reconcile a credit' },
};

export function roleRefusal(type: ClaimEventType, role: Role): string | null {
  const rule = EVENT_RULES[type];
  return rule.roles.includes(role) ? null : `Only ${rule.who} can ${rule.does}.`;
}

export function standingRefusal(type: ClaimEventType, context: ClaimContext, standing: Standing): string | null {
  return EVENT_RULES[type].standing?.(context, standing) ?? null;
}

/** Shape of the step itself: a known type, an actor and a time. */
export function shapeRefusal(event: unknown): string | null {
  const type = (event as { type?: unknown } | null)?.type;
  if (!isClaimEventType(type)) return `"${String(type)}" is not a step a claim knows.`;
  return stepBaseProblem(event);
}

/**
 * Every refusal that does not depend on the claim's state: shape, role, standing, then the step's data.
 * The machine's guards call this, so the machine and the explanations cannot disagree.
 */
export function ruleRefusal(context: ClaimContext, event: ClaimEvent): string | null {
  return (
    shapeRefusal(event) ??
    roleRefusal(event.type, event.actor.role) ??
    standingRefusal(event.type, context, {
      actor: event.actor,
      at: event.at,
      noOtherRep: event.type === 'TAKE' ? event.noOtherRep : undefined,
    }) ??
    payloadProblem(event) ??
    EVENT_RULES[event.type].data?.(context, event) ??
    null
  );
}
