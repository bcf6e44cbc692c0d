import type { AnyStateNode, StateValue } from 'xstate';
import type { ClaimContext } from './claim-context';
import { CLAIM_EVENT_TYPES, type Actor, type ClaimEvent, type ClaimEventType } from './claim-events';
import { roleRefusal, ruleRefusal, shapeRefusal, standingRefusal } from './claim-rules';
import { describeState, EVENT_LABELS, type ClaimStateDescription, type CoreState } from './claim-states';

/** The parts of a snapshot these helpers read; any snapshot of `claimMachine` fits. */
export interface ClaimSnapshotLike {
  value: StateValue;
  context: ClaimContext;
  machine: { root: AnyStateNode };
  can(event: ClaimEvent): boolean;
}

export const NO_REFUSAL = 'Nothing prevents this step.';

function activeNodes(node: AnyStateNode, value: StateValue): AnyStateNode[] {
  if (typeof value === 'string') {
    const child = node.states[value];
    return child ? [node, child] : [node];
  }
  const out: AnyStateNode[] = [node];
  for (const [key, sub] of Object.entries(value)) {
    const child = node.states[key];
    if (child && sub !== undefined) out.push(...activeNodes(child, sub));
  }
  return out;
}

/** Whether the claim's current state has any transition for this step type (ignoring guards). */
export function stateAccepts(snapshot: ClaimSnapshotLike, type: ClaimEventType): boolean {
  return activeNodes(snapshot.machine.root, snapshot.value).some((n) => Object.keys(n.on).includes(type));
}

const CORE_PHRASE: Record<CoreState, string> = {
  requested: 'requested and not yet shipped',
  in_transit: 'on its way back',
  received: 'received',
  inspected: 'inspected',
  waived: 'waived',
  written_off: 'written off',
};

const CREDIT_STAGES = new Set(['credit_pending', 'credited']);

function stateRefusal(d: ClaimStateDescription, type: ClaimEventType): string {
  const s = d.stage;
  if (s === 'withdrawn') {
    return type === 'WITHDRAW' ? 'This claim was withdrawn already.' : 'This claim was withdrawn; nothing more can happen to it.';
  }
  if (s === 'reconciled') {
    return type === 'RECONCILE'
      ? 'This claim is already reconciled.'
      : 'This claim is reconciled and closed; nothing more can happen to it.';
  }
  const approvedOrLater = s === 'approved' || CREDIT_STAGES.has(s);
  const notSubmitted = 'This claim is still a draft; it has not been submitted.';

  switch (type) {
    case 'SUBMIT':
      return s === 'waiting_on_dealer'
        ? `The rep asked for more; use "${EVENT_LABELS.RESUBMIT.action}" instead.`
        : 'This claim was submitted already.';
    case 'RESUBMIT':
      if (s === 'draft') return 'This claim is still a draft; submit it first.';
      return 'The rep has not asked for anything more; there is nothing to resubmit.';
    case 'WITHDRAW':
      return approvedOrLater
        ? 'This claim is already approved; it cannot be withdrawn.'
        : 'This claim was already denied; it cannot be withdrawn.';
    case 'TAKE':
      if (s === 'draft') return notSubmitted;
      if (s === 'in_review' || s === 'waiting_on_dealer') return 'This claim is already assigned to a rep.';
      if (s === 'denied') return 'This claim was denied; it goes back to a rep only if the dealer appeals.';
      return 'This claim is already decided; there is nothing to take.';
    case 'RELEASE':
      if (s === 'draft') return notSubmitted;
      if (s === 'submitted' || s === 'appealed') return 'This claim is not assigned to anyone.';
      if (s === 'waiting_on_dealer') return 'This claim is waiting on the dealer; it can be released after the dealer resubmits.';
      return 'This claim is already decided; there is nothing to release.';
    case 'REQUEST_INFO':
    case 'APPROVE':
    case 'DENY':
      if (s === 'draft') return notSubmitted;
      if (s === 'submitted' || s === 'appealed') return 'Take this claim for review first.';
      if (s === 'waiting_on_dealer') {
        return type === 'REQUEST_INFO'
          ? 'The dealer was already asked; wait for the resubmission.'
          : 'This claim is waiting on the dealer; decide it after the dealer resubmits.';
      }
      if (s === 'denied') {
        return type === 'DENY'
          ? 'This claim was already denied.'
          : 'This claim was denied; it can be reviewed again only after an appeal.';
      }
      return type === 'DENY' ? 'This claim is already approved; it cannot be denied.' : 'This claim is already approved.';
    case 'APPEAL':
      return `Only a denied claim can be appealed; this claim is ${d.label.toLowerCase()}.`;
    case 'SHIP':
    case 'MARK_FITTED':
    case 'SUBMIT_AFTER_TEST':
    case 'ACCEPT_BY_HAND': {
      if (CREDIT_STAGES.has(s)) return 'The replacement is already verified.';
      if (s !== 'approved') return 'There is no replacement before the claim is approved.';
      const r = d.replacement;
      if (r === 'verified') {
        return type === 'SUBMIT_AFTER_TEST'
          ? 'The replacement is already verified; no new after-test is needed.'
          : 'The replacement is already verified.';
      }
      if (type === 'SHIP') {
        return r === 'from_shop_stock'
          ? 'There is nothing to ship: the dealer fitted every approved part from its own stock.'
          : 'The replacement has already shipped.';
      }
      if (type === 'MARK_FITTED') {
        return r === 'to_ship'
          ? 'The replacement has not shipped yet.'
          : `The replacement is already marked fitted; use "${EVENT_LABELS.SUBMIT_AFTER_TEST.action}" instead.`;
      }
      if (type === 'SUBMIT_AFTER_TEST') return 'Mark the replacement fitted first; its after-test goes with it.';
      return 'There is no after-test to accept yet: the replacement is not fitted.';
    }
    case 'ISSUE_RETURN_LABEL':
    case 'REMIND_CORE':
    case 'CORE_SHIPPED':
    case 'CORE_RECEIVED':
    case 'INSPECT':
    case 'WAIVE_CORE':
    case 'WRITE_OFF_CORE': {
      if (CREDIT_STAGES.has(s)) return 'The core return is already finished.';
      if (s !== 'approved' || d.core === undefined) return 'There is no core return before the claim is approved.';
      const c = d.core;
      if (type === 'INSPECT' && (c === 'requested' || c === 'in_transit')) return 'The core has not been received yet.';
      if (type === 'CORE_SHIPPED' && c === 'in_transit') return 'The core was already marked shipped.';
      return `The core return is past that step: the core is ${CORE_PHRASE[c]}.`;
    }
    case 'ISSUE_CREDIT':
      if (s === 'approved') return 'The credit is issued once both the replacement and the core return are finished.';
      if (s === 'credited') return 'The credit memo was already issued.';
      return 'This claim has not been approved; there is no credit to issue.';
    case 'RECONCILE':
      if (s === 'approved' || s === 'credit_pending') return 'There is no credit memo to reconcile yet; issue it first.';
      return 'This claim has not been approved; there is no credit to reconcile.';
  }
}

/**
 * Why this step is refused now, or null when it is allowed. Checks, in order: the step's shape, the
 * actor's role, the claim's state, who may act (assignment, appeal rules), then the step's data.
 */
export function refusalOf(snapshot: ClaimSnapshotLike, event: unknown): string | null {
  const shape = shapeRefusal(event);
  if (shape !== null) return shape;
  const step = event as ClaimEvent;
  const reason =
    roleRefusal(step.type, step.actor.role) ??
    (stateAccepts(snapshot, step.type) ? null : stateRefusal(describeState(snapshot.value), step.type)) ??
    ruleRefusal(snapshot.context, step);
  if (reason !== null) return reason;
  return snapshot.can(step) ? null : 'This step is not possible now.';
}

/** Why an event is not allowed in this state for this actor, in plain words; NO_REFUSAL when it is allowed. */
export function explainRefusal(snapshot: ClaimSnapshotLike, event: unknown): string {
  return refusalOf(snapshot, event) ?? NO_REFUSAL;
}

export interface AllowedEventsOptions {
  /** The time the step would happen; without it, time-bound rules (appeal window, write-off) are not applied. */
  at?: string;
  noOtherRep?: boolean;
}

/**
 * The step types this actor may send now, for showing buttons. The step's own data (evidence, reason
 * codes, numbers) is not known yet and is checked when the step is sent.
 */
export function allowedEvents(
  snapshot: ClaimSnapshotLike,
  actor: Actor,
  options: AllowedEventsOptions = {},
): ClaimEventType[] {
  return CLAIM_EVENT_TYPES.filter(
    (type) =>
      roleRefusal(type, actor.role) === null &&
      stateAccepts(snapshot, type) &&
      standingRefusal(type, snapshot.context, { actor, at: options.at, noOtherRep: options.noOtherRep }) === null,
  );
}
