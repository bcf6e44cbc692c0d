// Shared fixtures for the claim machine tests: invented people, a clock, step builders and a driver
// that stores and reloads the claim as JSON around every step, the way the server does.
import { expect } from 'vitest';
import { transition } from 'xstate';
import {
  claimMachine,
  explainRefusal,
  initialClaimSnapshot,
  type Actor,
  type ClaimEvent,
  type ClaimStateValue,
  type StoredClaim,
} from '@/machines/claim';

export const PEOPLE = {
  dealer: { id: 'u-counter-mira', role: 'dealer' },
  dealer_admin: { id: 'u-owner-tomas', role: 'dealer_admin' },
  rep1: { id: 'u-rep-ines', role: 'brand_rep' },
  rep2: { id: 'u-rep-kofi', role: 'brand_rep' },
  warehouse: { id: 'u-dock-lena', role: 'warehouse' },
  accountant: { id: 'u-books-arvo', role: 'accountant' },
  brand_admin: { id: 'u-admin-sade', role: 'brand_admin' },
  system: { id: 'system-clock', role: 'system' },
} as const satisfies Record<string, Actor>;
export type PersonKey = keyof typeof PEOPLE;
export const PERSON_KEYS = Object.keys(PEOPLE) as PersonKey[];

/** Hands out increasing ISO timestamps, one hour apart, from 2026-02-02 09:00 UTC. */
export class Clock {
  private t = Date.parse('2026-02-02T09:00:00.000Z');
  next(hours = 1): string {
    this.t += hours * 3_600_000;
    return new Date(this.t).toISOString();
  }
}

export const COMPLETE_EVIDENCE = { photos: 3, serialLabelPhotos: 1, beforeTests: 1, proofOfPurchase: true, registered: false };
export const APPEAL_WINDOW_END = '2026-12-31T23:59:59.000Z';

type Who = Actor;
const d = PEOPLE.dealer;
const wh = PEOPLE.warehouse;

/** Valid steps; each takes its time from the clock unless one is given. */
export function steps(clock: Clock) {
  const at = () => clock.next();
  return {
    submit: (actor: Who = d): ClaimEvent => ({ type: 'SUBMIT', actor, at: at(), evidence: { ...COMPLETE_EVIDENCE } }),
    withdraw: (actor: Who = d): ClaimEvent => ({ type: 'WITHDRAW', actor, at: at(), note: 'Customer fixed it elsewhere' }),
    take: (actor: Who = PEOPLE.rep1, noOtherRep?: boolean): ClaimEvent =>
      noOtherRep === undefined ? { type: 'TAKE', actor, at: at() } : { type: 'TAKE', actor, at: at(), noOtherRep },
    release: (actor: Who = PEOPLE.rep1): ClaimEvent => ({ type: 'RELEASE', actor, at: at() }),
    requestInfo: (actor: Who = PEOPLE.rep1, checklist = ['Photo of the connector pins']): ClaimEvent => ({
      type: 'REQUEST_INFO',
      actor,
      at: at(),
      checklist,
      message: 'Please add what is on the list.',
    }),
    resubmit: (actor: Who = d): ClaimEvent => ({ type: 'RESUBMIT', actor, at: at(), evidence: { ...COMPLETE_EVIDENCE, photos: 4 } }),
    approveFull: (actor: Who = PEOPLE.rep1): ClaimEvent => ({
      type: 'APPROVE',
      actor,
      at: at(),
      extent: 'full',
      lines: [
        { lineId: 'part-1', approved: true },
        { lineId: 'labor-1', approved: true },
      ],
      rmaNumber: 'LP-RMA-0042',
    }),
    approvePartial: (actor: Who = PEOPLE.rep1): ClaimEvent => ({
      type: 'APPROVE',
      actor,
      at: at(),
      extent: 'partial',
      lines: [
        { lineId: 'part-1', approved: true },
        { lineId: 'freight-1', approved: false, note: 'Freight not agreed for this dealer' },
      ],
      rmaNumber: 'LP-RMA-0043',
    }),
    deny: (actor: Who = PEOPLE.rep1, appealOpenUntil = APPEAL_WINDOW_END): ClaimEvent => ({
      type: 'DENY',
      actor,
      at: at(),
      reasonCode: 'water_ingress',
      message: 'Corrosion inside the connector.',
      appealOpenUntil,
    }),
    appeal: (actor: Who = d): ClaimEvent => ({ type: 'APPEAL', actor, at: at(), message: 'The seal was intact; see new photos.' }),
    ship: (actor: Who = wh): ClaimEvent => ({ type: 'SHIP', actor, at: at(), carrier: 'Northway Freight', trackingNumber: 'NW-77001' }),
    fitted: (passes: boolean, actor: Who = d): ClaimEvent => ({
      type: 'MARK_FITTED',
      actor,
      at: at(),
      afterTestId: 'test-after-1',
      afterTestPasses: passes,
    }),
    afterTest: (passes: boolean, id = 'test-after-2', actor: Who = d): ClaimEvent => ({
      type: 'SUBMIT_AFTER_TEST',
      actor,
      at: at(),
      afterTestId: id,
      afterTestPasses: passes,
    }),
    acceptByHand: (actor: Who = PEOPLE.rep1): ClaimEvent => ({
      type: 'ACCEPT_BY_HAND',
      actor,
      at: at(),
      reason: 'Roller slipped; the road test shows full assist.',
    }),
    label: (actor: Who = wh): ClaimEvent => ({ type: 'ISSUE_RETURN_LABEL', actor, at: at(), labelRef: 'label-991', dangerousGoods: true }),
    remind: (actor: Who = PEOPLE.system): ClaimEvent => ({ type: 'REMIND_CORE', actor, at: at() }),
    coreShipped: (actor: Who = d): ClaimEvent => ({
      type: 'CORE_SHIPPED',
      actor,
      at: at(),
      carrier: 'Northway Freight',
      trackingNumber: 'NW-88002',
    }),
    coreReceived: (actor: Who = wh): ClaimEvent => ({ type: 'CORE_RECEIVED', actor, at: at(), condition: 'sound' }),
    inspect: (result: 'fault_confirmed' | 'no_fault_found' | 'not_covered', actor: Who = wh): ClaimEvent => ({
      type: 'INSPECT',
      actor,
      at: at(),
      result,
      notes: result === 'fault_confirmed' ? undefined : 'Bench test within spec; housing cracked.',
    }),
    waive: (reason: 'local_recycling' | 'scrapped_at_shop' = 'local_recycling', actor: Who = PEOPLE.rep1): ClaimEvent => ({
      type: 'WAIVE_CORE',
      actor,
      at: at(),
      reason,
      proofAttachmentId: 'att-recycling-slip',
    }),
    writeOff: (actor: Who = PEOPLE.system): ClaimEvent => ({ type: 'WRITE_OFF_CORE', actor, at: at() }),
    credit: (actor: Who = PEOPLE.accountant): ClaimEvent => ({ type: 'ISSUE_CREDIT', actor, at: at(), memoId: 'memo-5001' }),
    reconcile: (actor: Who = PEOPLE.accountant): ClaimEvent => ({
      type: 'RECONCILE',
      actor,
      at: at(),
      statementLineRef: 'stmt-2026-03-line-14',
    }),
  };
}

export function newDraft(): StoredClaim {
  return initialClaimSnapshot({ openedBy: PEOPLE.dealer, openedAt: '2026-02-02T08:00:00.000Z' });
}

function throughJson<T>(value: T): T {
  return JSON.parse(JSON.stringify(value)) as T;
}

/**
 * Applies each step as the server would: load from JSON, resolveState, can, transition, store as JSON.
 * Asserts every step is allowed, lands on the expected value, and that what was stored reloads identically.
 */
export function drive(
  path: Array<[ClaimEvent, ClaimStateValue]>,
  start: StoredClaim = newDraft(),
): StoredClaim {
  let stored = throughJson(start);
  for (const [event, expected] of path) {
    const snapshot = claimMachine.resolveState(throughJson(stored));
    expect(snapshot.can(event), `${event.type}: ${explainRefusal(snapshot, event)}`).toBe(true);
    const [next] = transition(claimMachine, snapshot, event);
    expect(next.value, `after ${event.type}`).toEqual(expected);
    const saved = throughJson({ value: next.value, context: next.context });
    // Nothing is lost or changed by the jsonb round trip.
    expect(saved.context).toStrictEqual(next.context);
    const reloaded = claimMachine.resolveState(saved);
    expect(reloaded.value).toStrictEqual(next.value);
    expect(reloaded.context).toStrictEqual(next.context);
    expect(reloaded.status).toBe(next.status);
    stored = saved as StoredClaim;
  }
  return stored;
}

export function snapshotOf(stored: StoredClaim) {
  return claimMachine.resolveState(throughJson(stored));
}

export const approvedValue = (
  replacement: 'to_ship' | 'from_shop_stock' | 'shipped' | 'fitted' | 'verified',
  core: 'requested' | 'in_transit' | 'received' | 'inspected' | 'waived' | 'written_off',
): ClaimStateValue => ({ approved: { replacement, core } });
