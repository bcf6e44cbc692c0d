/**
 * The claim lifecycle: the machine and everything the server and screens need around it.
 *
 *   const { value, context } = initialClaimSnapshot({ openedBy, openedAt });   // a new draft, JSON-safe
 *   const snapshot = claimMachine.resolveState({ value, context });           // or restoreClaim(stored)
 *   if (!snapshot.can(event)) refuse(explainRefusal(snapshot, event));        // nothing changes
 *   const [next] = transition(claimMachine, snapshot, event);                 // store next.value, next.context
 *
 * `stepClaim(stored, event)` does the three steps at once. `describeState(value)` gives the flat stage key
 * and label to index and show; `allowedEvents(snapshot, actor)` gives the buttons.
 */
export { claimMachine } from './claim-machine';
export * from './claim-events';
export * from './claim-context';
export * from './claim-states';
export {
  allowedEvents,
  explainRefusal,
  NO_REFUSAL,
  refusalOf,
  stateAccepts,
  type AllowedEventsOptions,
  type ClaimSnapshotLike,
} from './claim-explain';
export { EVENT_RULES, type Standing } from './claim-rules';
export {
  initialClaimSnapshot,
  restoreClaim,
  stepClaim,
  storedFrom,
  type ClaimSnapshot,
  type StepResult,
  type StoredClaim,
} from './claim-snapshot';
