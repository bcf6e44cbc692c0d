// The claim lifecycle: the machine and everything the server and screens need around it.
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
