import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/connection';
import { findClaimById, findClaimForUser, insertEvent, writeStep, type ClaimRecord } from '@/lib/db/claims';
import type { AppUser } from '@/lib/db/users';
import { ConflictError, ForbiddenError, NotFoundError } from '@/lib/errors';
import { describeState, EVENT_RULES, stepClaim, type ClaimEvent, type ClaimEventType, type StoredClaim } from '@/machines/claim';

/** Who takes a step: a signed-in user (tenant-scoped), or the server's own clock (`system`). */
export type StepActor = AppUser | SystemActor;
export type SystemActor = { kind: 'system'; reason: string };
export const SYSTEM: SystemActor = { kind: 'system', reason: 'scheduled job' };
const isSystem = (a: StepActor): a is SystemActor => (a as SystemActor).kind === 'system';

export type StepContext = { trx: Knex; claim: ClaimRecord; user: StepActor; at: string };

export type StepOptions = {
  /** The version the caller last saw; a different current version is a stale step (409). */
  expectedVersion?: number;
  /** Fields only the server may fill in (evidence counts, RMA number, deadlines…), read inside the transaction. */
  prepare?: (ctx: StepContext) => Promise<Record<string, unknown>>;
  /** Extra claim columns to write with the new state (rma_number, review_due_on…). */
  columns?: (ctx: StepContext, next: StoredClaim) => Promise<Record<string, unknown>> | Record<string, unknown>;
  /** Writes in the same transaction after the step: notifications, outbox mail, related rows. */
  after?: (ctx: StepContext, next: StoredClaim, event: ClaimEvent) => Promise<void>;
  /** What the event log keeps of the step beyond its type (defaults to the event without actor/at). */
  logPayload?: Record<string, unknown>;
};

export type StepOutcome = { claimId: string; version: number; from: unknown; to: unknown; stage: string; label: string };

/** The current state, sent back with every refusal so the screen can catch up. */
function currentOf(claim: ClaimRecord) {
  const d = describeState(claim.stateValue);
  return { state: claim.stateValue, stage: d.stage, label: d.label, version: claim.version };
}

/**
 * The one way a claim changes state: lock the row (tenant-scoped), rehydrate the machine,
 * ask it, transition, then write state + event in the same transaction guarded by the
 * version. A refused or stale step throws and changes nothing.
 */
export async function applyStep(
  user: StepActor,
  claimId: string,
  type: ClaimEventType,
  payload: Record<string, unknown>,
  opts: StepOptions = {},
): Promise<StepOutcome> {
  return db().transaction(async (trx) => {
    const claim = isSystem(user) ? await findClaimById(claimId, trx, true) : await findClaimForUser(user, claimId, trx, true);
    if (!claim) throw new NotFoundError('No such claim.');
    if (opts.expectedVersion !== undefined && opts.expectedVersion !== claim.version) {
      throw new ConflictError('This claim changed since you opened it. Here is where it stands now; nothing was changed.', currentOf(claim));
    }
    const at = new Date().toISOString();
    const ctx: StepContext = { trx, claim, user, at };
    const prepared = opts.prepare ? await opts.prepare(ctx) : {};
    const actor = isSystem(user) ? { id: 'system', role: 'system' as const } : { id: user.id, role: user.role };
    const event = { ...payload, ...prepared, type, actor, at } as ClaimEvent;
    const stored: StoredClaim = { value: claim.stateValue, context: claim.context };
    const result = stepClaim(stored, event);
    if (!result.ok) {
      const roleNeverAllowed = !(EVENT_RULES[type].roles as readonly string[]).includes(actor.role);
      if (roleNeverAllowed) throw new ForbiddenError(result.refusal);
      throw new ConflictError(result.refusal, currentOf(claim));
    }
    const columns = opts.columns ? await opts.columns(ctx, result.stored) : {};
    const written = await writeStep(trx, claim, { stateValue: result.stored.value, context: result.stored.context, extra: columns });
    if (!written) throw new ConflictError('Someone else changed this claim at the same moment; nothing was changed.', currentOf(claim));
    const { actor: _a, at: _t, type: _ty, ...rest } = event as ClaimEvent & Record<string, unknown>;
    await insertEvent(trx, {
      claimId: claim.id, actorId: isSystem(user) ? null : user.id, actorRole: actor.role, event: type,
      fromState: result.from, toState: result.to, payload: opts.logPayload ?? rest,
    });
    if (opts.after) await opts.after(ctx, result.stored, event);
    const d = describeState(result.to);
    return { claimId: claim.id, version: claim.version + 1, from: result.from, to: result.to, stage: d.stage, label: d.label };
  });
}

/** Log rows that are not state changes (a message, new evidence), under the same lock. */
export async function logClaimNote(
  trx: Knex,
  user: AppUser,
  claim: ClaimRecord,
  event: string,
  payload: Record<string, unknown>,
): Promise<void> {
  await insertEvent(trx, { claimId: claim.id, actorId: user.id, actorRole: user.role, event, fromState: claim.stateValue, toState: claim.stateValue, payload });
}
