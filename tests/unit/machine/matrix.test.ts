// Every state × every step type × every role: `can` must match the table below, which is written from the
// product brief and the assignment rules (who may do what, in which state), not read from the machine.
import { describe, expect, it } from 'vitest';
import { transition } from 'xstate';
import {
  allowedEvents,
  claimMachine,
  CLAIM_EVENT_TYPES,
  explainRefusal,
  NO_REFUSAL,
  refusalOf,
  type ClaimEvent,
  type ClaimEventType,
  type ClaimStateValue,
} from '@/machines/claim';
import { approvedValue, Clock, COMPLETE_EVIDENCE, drive, PEOPLE, PERSON_KEYS, snapshotOf, steps, type PersonKey } from './support';

type Step = [ClaimEvent, ClaimStateValue];
type Table = Partial<Record<ClaimEventType, readonly PersonKey[]>>;

const DEALERS = ['dealer', 'dealer_admin'] as const;
const REPS = ['rep1', 'rep2'] as const;

// ---- the table (independent of the machine) ----

const REPLACEMENT_TABLE: Record<'to_ship' | 'shipped' | 'fitted' | 'verified', Table> = {
  to_ship: { SHIP: ['warehouse'] },
  shipped: { MARK_FITTED: DEALERS },
  fitted: { SUBMIT_AFTER_TEST: DEALERS, ACCEPT_BY_HAND: REPS },
  verified: {},
};
const CORE_TABLE: Record<'requested' | 'in_transit' | 'received' | 'inspected' | 'waived' | 'written_off', Table> = {
  // The fixture for `requested` has had one reminder, so a write-off is due.
  requested: {
    ISSUE_RETURN_LABEL: ['warehouse'],
    REMIND_CORE: ['system'],
    CORE_SHIPPED: DEALERS,
    CORE_RECEIVED: ['warehouse'],
    WAIVE_CORE: REPS,
    WRITE_OFF_CORE: ['system'],
  },
  in_transit: { CORE_RECEIVED: ['warehouse'] },
  received: { INSPECT: ['warehouse'] },
  inspected: {},
  waived: {},
  written_off: {},
};

const STAGE_TABLE: Record<string, Table> = {
  draft: { SUBMIT: DEALERS, WITHDRAW: DEALERS },
  submitted: { TAKE: REPS, WITHDRAW: DEALERS },
  // Taken by rep1.
  in_review: { RELEASE: ['rep1'], REQUEST_INFO: ['rep1'], APPROVE: ['rep1'], DENY: ['rep1'], WITHDRAW: DEALERS },
  waiting_on_dealer: { RESUBMIT: DEALERS, WITHDRAW: DEALERS },
  // Denied by rep1, appeal window open.
  denied: { APPEAL: DEALERS },
  // rep1 denied it, so only another rep may take the appeal.
  appealed: { TAKE: ['rep2'], WITHDRAW: DEALERS },
  in_review_after_appeal: { RELEASE: ['rep2'], REQUEST_INFO: ['rep2'], APPROVE: ['rep2'], DENY: ['rep2'], WITHDRAW: DEALERS },
  waiting_on_dealer_after_appeal: { RESUBMIT: DEALERS, WITHDRAW: DEALERS },
  denied_after_appeal: {},
  withdrawn: {},
  credit_pending: { ISSUE_CREDIT: ['accountant'] },
  credited: { RECONCILE: ['accountant'] },
  reconciled: {},
};

// ---- fixtures: how each state is reached ----

function fixtures(): Array<{ name: string; path: Step[]; table: Table }> {
  const c = new Clock();
  const s = steps(c);
  const review: Step[] = [
    [s.submit(), 'submitted'],
    [s.take(PEOPLE.rep1), 'in_review'],
  ];
  const appealed: Step[] = [...review, [s.deny(PEOPLE.rep1), 'denied'], [s.appeal(), 'appealed']];
  const afterAppeal: Step[] = [...appealed, [s.take(PEOPLE.rep2), 'in_review']];
  const approve: Step = [s.approveFull(PEOPLE.rep1), approvedValue('to_ship', 'requested')];

  const replacementPaths = {
    to_ship: [] as Array<[ClaimEvent, string]>,
    shipped: [[s.ship(), 'shipped']] as Array<[ClaimEvent, string]>,
    fitted: [[s.ship(), 'shipped'], [s.fitted(false), 'fitted']] as Array<[ClaimEvent, string]>,
    verified: [[s.ship(), 'shipped'], [s.fitted(true), 'verified']] as Array<[ClaimEvent, string]>,
  };
  const corePaths = {
    requested: [[s.remind(), 'requested']] as Array<[ClaimEvent, string]>,
    in_transit: [[s.coreShipped(), 'in_transit']] as Array<[ClaimEvent, string]>,
    received: [[s.coreShipped(), 'in_transit'], [s.coreReceived(), 'received']] as Array<[ClaimEvent, string]>,
    inspected: [[s.coreShipped(), 'in_transit'], [s.coreReceived(), 'received'], [s.inspect('no_fault_found'), 'inspected']] as Array<
      [ClaimEvent, string]
    >,
    waived: [[s.waive(), 'waived']] as Array<[ClaimEvent, string]>,
    written_off: [[s.remind(), 'requested'], [s.writeOff(), 'written_off']] as Array<[ClaimEvent, string]>,
  };

  const out: Array<{ name: string; path: Step[]; table: Table }> = [
    { name: 'draft', path: [], table: STAGE_TABLE.draft! },
    { name: 'submitted', path: [[s.submit(), 'submitted']], table: STAGE_TABLE.submitted! },
    { name: 'in_review', path: review, table: STAGE_TABLE.in_review! },
    { name: 'waiting_on_dealer', path: [...review, [s.requestInfo(), 'waiting_on_dealer']], table: STAGE_TABLE.waiting_on_dealer! },
    { name: 'denied', path: [...review, [s.deny(PEOPLE.rep1), 'denied']], table: STAGE_TABLE.denied! },
    { name: 'appealed', path: appealed, table: STAGE_TABLE.appealed! },
    { name: 'in_review_after_appeal', path: afterAppeal, table: STAGE_TABLE.in_review_after_appeal! },
    {
      name: 'waiting_on_dealer_after_appeal',
      path: [...afterAppeal, [s.requestInfo(PEOPLE.rep2), 'waiting_on_dealer']],
      table: STAGE_TABLE.waiting_on_dealer_after_appeal!,
    },
    { name: 'denied_after_appeal', path: [...afterAppeal, [s.deny(PEOPLE.rep2), 'denied']], table: STAGE_TABLE.denied_after_appeal! },
    { name: 'withdrawn', path: [...review, [s.withdraw(), 'withdrawn']], table: STAGE_TABLE.withdrawn! },
  ];

  const finalCore = ['inspected', 'waived', 'written_off'];
  for (const r of Object.keys(replacementPaths) as Array<keyof typeof replacementPaths>) {
    for (const k of Object.keys(corePaths) as Array<keyof typeof corePaths>) {
      if (r === 'verified' && finalCore.includes(k)) continue; // both done: the claim has moved on
      const path: Step[] = [...review, approve];
      let cur = { r: 'to_ship', c: 'requested' };
      for (const [e, next] of replacementPaths[r]) {
        cur = { ...cur, r: next };
        path.push([e, { approved: { replacement: cur.r, core: cur.c } } as ClaimStateValue]);
      }
      for (const [e, next] of corePaths[k]) {
        cur = { ...cur, c: next };
        path.push([e, { approved: { replacement: cur.r, core: cur.c } } as ClaimStateValue]);
      }
      out.push({ name: `approved: ${r} / ${k}`, path, table: { ...REPLACEMENT_TABLE[r], ...CORE_TABLE[k] } });
    }
  }

  const done: Step[] = [
    ...review,
    approve,
    [s.ship(), approvedValue('shipped', 'requested')],
    [s.fitted(true), approvedValue('verified', 'requested')],
    [s.waive(), 'credit_pending'],
  ];
  out.push({ name: 'credit_pending', path: done, table: STAGE_TABLE.credit_pending! });
  out.push({ name: 'credited', path: [...done, [s.credit(), 'credited']], table: STAGE_TABLE.credited! });
  out.push({
    name: 'reconciled',
    path: [...done, [s.credit(), 'credited'], [s.reconcile(), 'reconciled']],
    table: STAGE_TABLE.reconciled!,
  });
  return out;
}

// One valid step of each type, dated after every fixture step and inside the appeal window.
const AT = '2026-06-01T12:00:00.000Z';
function probe(type: ClaimEventType, who: PersonKey): ClaimEvent {
  const actor = PEOPLE[who];
  const base = { actor, at: AT };
  switch (type) {
    case 'SUBMIT': return { ...base, type, evidence: { ...COMPLETE_EVIDENCE } };
    case 'WITHDRAW': return { ...base, type };
    case 'TAKE': return { ...base, type };
    case 'RELEASE': return { ...base, type };
    case 'REQUEST_INFO': return { ...base, type, checklist: ['Odometer photo'], message: 'One more photo, please.' };
    case 'RESUBMIT': return { ...base, type, evidence: { ...COMPLETE_EVIDENCE } };
    case 'APPROVE': return { ...base, type, extent: 'full', lines: [{ lineId: 'part-1', approved: true }], rmaNumber: 'LP-RMA-0099' };
    case 'DENY': return { ...base, type, reasonCode: 'wear_item', message: 'Brake pads are wear items.', appealOpenUntil: '2026-12-31T00:00:00.000Z' };
    case 'APPEAL': return { ...base, type, message: 'Please look again.' };
    case 'SHIP': return { ...base, type, carrier: 'Northway Freight', trackingNumber: 'NW-1' };
    case 'MARK_FITTED': return { ...base, type, afterTestId: 'test-x', afterTestPasses: true };
    case 'SUBMIT_AFTER_TEST': return { ...base, type, afterTestId: 'test-y', afterTestPasses: true };
    case 'ACCEPT_BY_HAND': return { ...base, type, reason: 'Road test confirms assist.' };
    case 'ISSUE_RETURN_LABEL': return { ...base, type, labelRef: 'label-2', dangerousGoods: false };
    case 'REMIND_CORE': return { ...base, type };
    case 'CORE_SHIPPED': return { ...base, type, carrier: 'Northway Freight', trackingNumber: 'NW-2' };
    case 'CORE_RECEIVED': return { ...base, type, condition: 'transit_damage', notes: 'Box crushed' };
    case 'INSPECT': return { ...base, type, result: 'fault_confirmed' };
    case 'WAIVE_CORE': return { ...base, type, reason: 'scrapped_at_shop', proofAttachmentId: 'att-1' };
    case 'WRITE_OFF_CORE': return { ...base, type };
    case 'ISSUE_CREDIT': return { ...base, type, memoId: 'memo-1' };
    case 'RECONCILE': return { ...base, type, statementLineRef: 'line-1' };
  }
}

describe('state × step × role matrix', () => {
  const all = fixtures();

  it('covers every state of the chart', () => {
    const names = new Set(all.map((f) => f.name));
    // 13 stage fixtures + 4 × 6 track pairs − 3 pairs that are already past the parallel state.
    expect(names.size).toBe(13 + 4 * 6 - 3);
  });

  it.each(all.map((f) => [f.name, f] as const))('%s', (_name, fixture) => {
    const stored = drive(fixture.path);
    const snapshot = snapshotOf(stored);
    const mismatches: string[] = [];
    for (const type of CLAIM_EVENT_TYPES) {
      for (const who of PERSON_KEYS) {
        const event = probe(type, who);
        const expected = (fixture.table[type] ?? []).includes(who);
        const can = snapshot.can(event);
        if (can !== expected) mismatches.push(`${type} by ${who}: can=${can}, table says ${expected} (${explainRefusal(snapshot, event)})`);
        const refusal = refusalOf(snapshot, event);
        if ((refusal === null) !== can) mismatches.push(`${type} by ${who}: refusalOf disagrees with can (${refusal})`);
        if (!can && explainRefusal(snapshot, event) === NO_REFUSAL) mismatches.push(`${type} by ${who}: refused without a reason`);
        if (can) {
          const [next] = transition(claimMachine, snapshot, event);
          const changed = JSON.stringify([next.value, next.context]) !== JSON.stringify([snapshot.value, snapshot.context]);
          if (!changed) mismatches.push(`${type} by ${who}: allowed but changed nothing`);
        }
      }
    }
    for (const who of PERSON_KEYS) {
      const expected = CLAIM_EVENT_TYPES.filter((t) => (fixture.table[t] ?? []).includes(who));
      const shown = allowedEvents(snapshot, PEOPLE[who], { at: AT });
      if (JSON.stringify(shown) !== JSON.stringify(expected)) {
        mismatches.push(`allowedEvents for ${who}: ${shown.join(',') || '-'}; table: ${expected.join(',') || '-'}`);
      }
    }
    expect(mismatches).toEqual([]);
  });
});
