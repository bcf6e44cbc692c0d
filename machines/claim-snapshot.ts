import { initialTransition, transition, type SnapshotFrom } from 'xstate';
import { actorSchema, DEALER_ROLES, type ClaimEvent } from './claim-events';
import type { ClaimContext, ClaimInput } from './claim-context';
import { claimMachine } from './claim-machine';
import { refusalOf } from './claim-explain';
import { describeState, type ClaimStateValue } from './claim-states';
import { z } from 'zod';

export type ClaimSnapshot = SnapshotFrom<typeof claimMachine>;

/** What is persisted for a claim (two jsonb columns). */
export interface StoredClaim {
  value: ClaimStateValue;
  context: ClaimContext;
}

const inputSchema = z.object(
  {
    openedBy: actorSchema.refine((a) => (DEALER_ROLES as readonly string[]).includes(a.role), {
      message: 'A claim is opened by a dealer user (role dealer or dealer_admin).',
    }),
    openedAt: z.iso.datetime({ offset: true, error: 'The opening time ("openedAt") must be an ISO 8601 timestamp with a time zone.' }),
  },
  { error: 'The claim input is missing.' },
);

function jsonCopy<T>(value: T): T {
  return JSON.parse(JSON.stringify(value)) as T;
}

/** The stored form of a snapshot: plain JSON, nothing but value and context. */
export function storedFrom(snapshot: ClaimSnapshot): StoredClaim {
  return jsonCopy({ value: snapshot.value as ClaimStateValue, context: snapshot.context });
}

/** Value and context of a new draft claim. Throws a TypeError naming the bad field. */
export function initialClaimSnapshot(input: ClaimInput): StoredClaim {
  const parsed = inputSchema.safeParse(input);
  if (!parsed.success) throw new TypeError(parsed.error.issues[0]?.message ?? 'The claim input is malformed.');
  const [snapshot] = initialTransition(claimMachine, input);
  return storedFrom(snapshot);
}

/** Rehydrate a stored claim. Throws a TypeError when the stored value is not a state of this machine. */
export function restoreClaim(stored: { value: unknown; context: unknown }): ClaimSnapshot {
  describeState(stored.value);
  if (typeof stored.context !== 'object' || stored.context === null) {
    throw new TypeError('The stored claim context must be an object.');
  }
  return claimMachine.resolveState({ value: stored.value as ClaimStateValue, context: stored.context as ClaimContext });
}

export type StepResult =
  | { ok: true; from: ClaimStateValue; to: ClaimStateValue; stored: StoredClaim }
  | { ok: false; from: ClaimStateValue; refusal: string };

/** One step from a stored claim to the next stored claim, or the reason it is refused (nothing changes). */
export function stepClaim(stored: StoredClaim, event: ClaimEvent): StepResult {
  const snapshot = restoreClaim(stored);
  const from = snapshot.value as ClaimStateValue;
  const refusal = refusalOf(snapshot, event);
  if (refusal !== null) return { ok: false, from, refusal };
  const [next] = transition(claimMachine, snapshot, event);
  const nextStored = storedFrom(next);
  return { ok: true, from: jsonCopy(from), to: nextStored.value, stored: nextStored };
}
