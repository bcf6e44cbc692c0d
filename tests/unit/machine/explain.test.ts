// Refusal wording, buttons, state descriptions and the chart's structure. The example sentences come from
// the lifecycle assignment; the structure follows the product brief ("Lifecycle").
import { describe, expect, it } from 'vitest';
import {
  allowedEvents,
  claimMachine,
  CLAIM_EVENT_TYPES,
  CORE_LABELS,
  CORE_STATES,
  describeState,
  EVENT_LABELS,
  explainRefusal,
  NO_REFUSAL,
  REPLACEMENT_LABELS,
  REPLACEMENT_STATES,
  STAGE_LABELS,
  STAGES,
  type ClaimEvent,
  type ClaimStateValue,
} from '@/machines/claim';
import { approvedValue, Clock, drive, PEOPLE, snapshotOf, steps } from './support';

type Step = [ClaimEvent, ClaimStateValue];

function at(stateSteps: (s: ReturnType<typeof steps>) => Step[]) {
  const s = steps(new Clock());
  return { snap: snapshotOf(drive(stateSteps(s))), s };
}

const inReview = (s: ReturnType<typeof steps>): Step[] => [
  [s.submit(), 'submitted'],
  [s.take(PEOPLE.rep1), 'in_review'],
];
const approved = (s: ReturnType<typeof steps>): Step[] => [...inReview(s), [s.approveFull(), approvedValue('to_ship', 'requested')]];

describe('explainRefusal: the example sentences', () => {
  it('only the assigned rep can approve', () => {
    const { snap, s } = at(inReview);
    expect(explainRefusal(snap, s.approveFull(PEOPLE.rep2))).toBe('Only the rep assigned to this claim can approve it.');
    expect(explainRefusal(snap, s.deny(PEOPLE.rep2))).toBe('Only the rep assigned to this claim can deny it.');
    expect(explainRefusal(snap, s.release(PEOPLE.rep2))).toBe('Only the rep assigned to this claim can release it.');
    expect(explainRefusal(snap, s.requestInfo(PEOPLE.rep2))).toBe('Only the rep assigned to this claim can ask the dealer for more.');
  });

  it('an approved claim cannot be withdrawn', () => {
    const { snap, s } = at(approved);
    expect(explainRefusal(snap, s.withdraw())).toBe('This claim is already approved; it cannot be withdrawn.');
  });

  it('one appeal only, and only inside the window', () => {
    const { snap, s } = at((s) => [
      ...inReview(s),
      [s.deny(PEOPLE.rep1, '2026-03-14T23:59:59Z'), 'denied'],
    ]);
    const late = { type: 'APPEAL', actor: PEOPLE.dealer, at: '2026-03-20T10:00:00Z', message: 'Late' } as const;
    expect(explainRefusal(snap, late)).toBe('The appeal window closed on 2026-03-14 at 23:59 UTC.');
    const twice = at((s) => [...inReview(s), [s.deny(), 'denied'], [s.appeal(), 'appealed'], [s.take(PEOPLE.rep2), 'in_review'], [s.deny(PEOPLE.rep2), 'denied']]);
    expect(explainRefusal(twice.snap, twice.s.appeal())).toBe('A denial can be appealed once; this claim was appealed already.');
    void s;
  });
});

describe('explainRefusal: role, state, standing and data, in that order', () => {
  it('names who may take the step', () => {
    const { snap, s } = at(approved);
    expect(explainRefusal(snap, s.ship(PEOPLE.dealer))).toBe('Only the brand warehouse can ship the replacement.');
    expect(explainRefusal(snap, s.waive('local_recycling', PEOPLE.warehouse))).toBe('Only a brand rep can waive the core return.');
    expect(explainRefusal(snap, s.writeOff(PEOPLE.brand_admin))).toMatch(/^Only the system clock/);
    expect(explainRefusal(snap, s.credit(PEOPLE.dealer_admin))).toBe('Only the brand accountant can issue a credit memo.');
    // Role comes before state: a dealer trying to approve hears about the role, not the state.
    expect(explainRefusal(snap, s.approveFull(PEOPLE.dealer))).toBe('Only a brand rep can approve a claim.');
  });

  it('says why the state does not allow it', () => {
    const draft = at(() => []);
    expect(explainRefusal(draft.snap, draft.s.take())).toBe('This claim is still a draft; it has not been submitted.');
    expect(explainRefusal(draft.snap, draft.s.resubmit())).toBe('This claim is still a draft; submit it first.');
    expect(explainRefusal(draft.snap, draft.s.ship())).toBe('There is no replacement before the claim is approved.');
    expect(explainRefusal(draft.snap, draft.s.inspect('fault_confirmed'))).toBe('There is no core return before the claim is approved.');

    const submitted = at((s) => [[s.submit(), 'submitted']]);
    expect(explainRefusal(submitted.snap, submitted.s.approveFull())).toBe('Take this claim for review first.');
    expect(explainRefusal(submitted.snap, submitted.s.submit())).toBe('This claim was submitted already.');

    const waiting = at((s) => [...inReview(s), [s.requestInfo(), 'waiting_on_dealer']]);
    expect(explainRefusal(waiting.snap, waiting.s.approveFull())).toBe('This claim is waiting on the dealer; decide it after the dealer resubmits.');

    const a = at(approved);
    expect(explainRefusal(a.snap, a.s.fitted(true))).toBe('The replacement has not shipped yet.');
    expect(explainRefusal(a.snap, a.s.inspect('fault_confirmed'))).toBe('The core has not been received yet.');
    expect(explainRefusal(a.snap, a.s.credit())).toBe('The credit is issued once both the replacement and the core return are finished.');
    expect(explainRefusal(a.snap, a.s.appeal())).toBe('Only a denied claim can be appealed; this claim is approved — to ship / core requested.');

    const moving = at((s) => [...approved(s), [s.coreShipped(), approvedValue('to_ship', 'in_transit')]]);
    expect(explainRefusal(moving.snap, moving.s.waive())).toBe('The core return is past that step: the core is on its way back.');
    expect(explainRefusal(moving.snap, moving.s.coreShipped())).toBe('The core was already marked shipped.');

    const gone = at((s) => [[s.withdraw(), 'withdrawn']]);
    expect(explainRefusal(gone.snap, gone.s.submit())).toBe('This claim was withdrawn; nothing more can happen to it.');
    expect(explainRefusal(gone.snap, gone.s.withdraw())).toBe('This claim was withdrawn already.');
  });

  it('lists the missing evidence on submit and resubmit', () => {
    const { snap } = at(() => []);
    const e = {
      type: 'SUBMIT',
      actor: PEOPLE.dealer,
      at: '2026-02-03T10:00:00Z',
      evidence: { photos: 1, serialLabelPhotos: 0, beforeTests: 1, proofOfPurchase: false, registered: true },
    } as const;
    expect(snap.can(e)).toBe(false);
    expect(explainRefusal(snap, e)).toBe(
      'This claim cannot go to the brand yet. Missing: one more photo of the failed part (at least two are needed); ' +
        'a photo of the serial label, tagged as the serial label (it counts as one of the photos).',
    );
    const waiting = at((s) => [...inReview(s), [s.requestInfo(), 'waiting_on_dealer']]);
    const re = { ...e, type: 'RESUBMIT' as const, evidence: { ...e.evidence, photos: 2, serialLabelPhotos: 1, beforeTests: 0 } };
    expect(explainRefusal(waiting.snap, re)).toBe(
      'This claim cannot go to the brand yet. Missing: a load test from before the repair (a dyno run or a battery capacity discharge).',
    );
  });

  it('refuses a malformed step with what is wrong', () => {
    const { snap } = at(() => []);
    expect(explainRefusal(snap, { type: 'PAY_NOW', actor: PEOPLE.dealer, at: '2026-02-03T10:00:00Z' })).toBe('"PAY_NOW" is not a step a claim knows.');
    expect(explainRefusal(snap, { type: 'WITHDRAW', at: '2026-02-03T10:00:00Z' })).toBe('The step has no actor.');
    expect(explainRefusal(snap, { type: 'WITHDRAW', actor: { id: 'x', role: 'customer' }, at: '2026-02-03T10:00:00Z' })).toMatch(
      /actor role must be one of/,
    );
    expect(explainRefusal(snap, { type: 'WITHDRAW', actor: { id: ' ', role: 'dealer' }, at: '2026-02-03T10:00:00Z' })).toBe(
      'The step has an empty actor id.',
    );
    expect(explainRefusal(snap, { type: 'WITHDRAW', actor: PEOPLE.dealer, at: 'yesterday' })).toMatch(/"at"\) must be an ISO 8601/);
    expect(explainRefusal(snap, { type: 'WITHDRAW', actor: PEOPLE.dealer })).toBe('The step has no time ("at").');
  });

  it('says nothing prevents an allowed step', () => {
    const { snap, s } = at(() => []);
    expect(explainRefusal(snap, s.submit())).toBe(NO_REFUSAL);
  });
});

describe('allowedEvents (buttons)', () => {
  it('shows each party its own buttons on an approved claim', () => {
    const { snap } = at((s) => [...approved(s), [s.ship(), approvedValue('shipped', 'requested')]]);
    expect(allowedEvents(snap, PEOPLE.dealer)).toEqual(['MARK_FITTED', 'CORE_SHIPPED']);
    expect(allowedEvents(snap, PEOPLE.warehouse)).toEqual(['ISSUE_RETURN_LABEL', 'CORE_RECEIVED']);
    expect(allowedEvents(snap, PEOPLE.rep2)).toEqual(['WAIVE_CORE']);
    expect(allowedEvents(snap, PEOPLE.system)).toEqual(['REMIND_CORE']); // no write-off before a reminder
    expect(allowedEvents(snap, PEOPLE.accountant)).toEqual([]);
  });

  it('applies the appeal window only when a time is given', () => {
    const { snap } = at((s) => [...inReview(s), [s.deny(PEOPLE.rep1, '2026-03-14T23:59:59Z'), 'denied']]);
    expect(allowedEvents(snap, PEOPLE.dealer)).toEqual(['APPEAL']);
    expect(allowedEvents(snap, PEOPLE.dealer, { at: '2026-03-14T12:00:00Z' })).toEqual(['APPEAL']);
    expect(allowedEvents(snap, PEOPLE.dealer, { at: '2026-03-15T00:00:01Z' })).toEqual([]);
  });

  it('offers the appeal to the denying rep only when the brand has no other rep', () => {
    const { snap } = at((s) => [...inReview(s), [s.deny(), 'denied'], [s.appeal(), 'appealed']]);
    expect(allowedEvents(snap, PEOPLE.rep1)).toEqual([]);
    expect(allowedEvents(snap, PEOPLE.rep1, { noOtherRep: true })).toEqual(['TAKE']);
    expect(allowedEvents(snap, PEOPLE.rep2)).toEqual(['TAKE']);
  });
});

describe('describeState', () => {
  it('gives each simple stage one key and our label', () => {
    expect(describeState('in_review')).toEqual({ stage: 'in_review', label: 'In review' });
    expect(describeState('waiting_on_dealer')).toEqual({ stage: 'waiting_on_dealer', label: 'Waiting on dealer' });
    for (const stage of STAGES.filter((x) => x !== 'approved')) {
      expect(describeState(stage)).toEqual({ stage, label: STAGE_LABELS[stage] });
    }
  });

  it('flattens the parallel approved stage', () => {
    expect(describeState({ approved: { replacement: 'shipped', core: 'in_transit' } })).toEqual({
      stage: 'approved',
      replacement: 'shipped',
      core: 'in_transit',
      label: 'Approved — shipped / core in transit',
    });
    for (const r of REPLACEMENT_STATES) {
      for (const c of CORE_STATES) {
        expect(describeState({ approved: { replacement: r, core: c } }).label).toBe(`Approved — ${REPLACEMENT_LABELS[r]} / ${CORE_LABELS[c]}`);
      }
    }
  });

  it('refuses what is not a state of the claim, saying what is wrong', () => {
    expect(() => describeState('paid')).toThrow('Unknown claim state "paid".');
    expect(() => describeState('approved')).toThrow(/needs both tracks/);
    expect(() => describeState({ approved: { replacement: 'lost', core: 'requested' } })).toThrow('Unknown replacement track state "lost".');
    expect(() => describeState({ approved: { replacement: 'shipped' } })).toThrow('Unknown core track state "undefined".');
    expect(() => describeState({ denied: 'x' })).toThrow(/only "approved" has tracks/);
    expect(() => describeState(42)).toThrow(/must be a state name/);
    expect(() => describeState(null)).toThrow(/must be a state name/);
  });
});

describe('the chart and its label lists agree', () => {
  const root = claimMachine.root;
  it('has exactly the listed stages and tracks', () => {
    expect(Object.keys(root.states).sort()).toEqual([...STAGES].sort());
    const approvedNode = root.states.approved!;
    expect(approvedNode.type).toBe('parallel');
    expect(Object.keys(approvedNode.states.replacement!.states).sort()).toEqual([...REPLACEMENT_STATES].sort());
    expect(Object.keys(approvedNode.states.core!.states).sort()).toEqual([...CORE_STATES].sort());
  });

  it('marks the right states final', () => {
    const finals = Object.entries(root.states).filter(([, n]) => n.type === 'final').map(([k]) => k).sort();
    expect(finals).toEqual(['reconciled', 'withdrawn']);
    const core = root.states.approved!.states.core!.states;
    expect(Object.entries(core).filter(([, n]) => n.type === 'final').map(([k]) => k).sort()).toEqual(['inspected', 'waived', 'written_off']);
    expect(root.states.approved!.states.replacement!.states.verified!.type).toBe('final');
  });

  it('labels every step, and every step is handled somewhere', () => {
    expect(Object.keys(EVENT_LABELS).sort()).toEqual([...CLAIM_EVENT_TYPES].sort());
    const handled = new Set<string>();
    const walk = (n: typeof root): void => {
      Object.keys(n.on).forEach((k) => handled.add(k));
      Object.values(n.states).forEach(walk);
    };
    walk(root);
    for (const t of CLAIM_EVENT_TYPES) expect(handled.has(t), t).toBe(true);
  });
});
