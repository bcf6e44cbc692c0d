// Every path of the lifecycle in the product brief (/work/shared/product/brief.md, "Lifecycle"), start to end.
// The expected state after each step is written out here by hand; the driver also stores and reloads the
// claim as JSON around every step.
import { describe, expect, it } from 'vitest';
import type { ClaimEvent, ClaimStateValue, StoredClaim } from '@/machines/claim';
import { explainRefusal } from '@/machines/claim';
import { approvedValue, APPEAL_WINDOW_END, Clock, drive, PEOPLE, snapshotOf, steps } from './support';

type Step = [ClaimEvent, ClaimStateValue];
type R = 'to_ship' | 'shipped' | 'fitted' | 'verified';
type C = 'requested' | 'in_transit' | 'received' | 'inspected' | 'waived' | 'written_off';

const CORE_DONE: readonly C[] = ['inspected', 'waived', 'written_off'];

function reviewPreamble(s: ReturnType<typeof steps>, kind: 'direct' | 'info_twice' | 'appeal'): Step[] {
  const head: Step[] = [
    [s.submit(), 'submitted'],
    [s.take(), 'in_review'],
  ];
  if (kind === 'info_twice') {
    return [
      ...head,
      [s.requestInfo(), 'waiting_on_dealer'],
      [s.resubmit(), 'in_review'],
      [s.requestInfo(PEOPLE.rep1, ['Battery label photo', 'Charger model']), 'waiting_on_dealer'],
      [s.resubmit(PEOPLE.dealer_admin), 'in_review'],
    ];
  }
  if (kind === 'appeal') {
    return [...head, [s.deny(), 'denied'], [s.appeal(), 'appealed'], [s.take(PEOPLE.rep2), 'in_review']];
  }
  return head;
}

const REPLACEMENT_PATHS = {
  passes_first_time: (s: ReturnType<typeof steps>): Array<[ClaimEvent, R]> => [
    [s.ship(), 'shipped'],
    [s.fitted(true), 'verified'],
  ],
  fails_then_accepted_by_hand: (s: ReturnType<typeof steps>): Array<[ClaimEvent, R]> => [
    [s.ship(), 'shipped'],
    [s.fitted(false), 'fitted'],
    [s.acceptByHand(), 'verified'],
  ],
  fails_then_new_pass: (s: ReturnType<typeof steps>): Array<[ClaimEvent, R]> => [
    [s.ship(), 'shipped'],
    [s.fitted(false), 'fitted'],
    [s.afterTest(false, 'test-after-2'), 'fitted'],
    [s.afterTest(true, 'test-after-3'), 'verified'],
  ],
};

const CORE_PATHS = {
  fault_confirmed: (s: ReturnType<typeof steps>): Array<[ClaimEvent, C]> => [
    [s.label(), 'requested'],
    [s.coreShipped(), 'in_transit'],
    [s.coreReceived(), 'received'],
    [s.inspect('fault_confirmed'), 'inspected'],
  ],
  no_fault_found: (s: ReturnType<typeof steps>): Array<[ClaimEvent, C]> => [
    [s.coreShipped(), 'in_transit'],
    [s.coreReceived(), 'received'],
    [s.inspect('no_fault_found'), 'inspected'],
  ],
  not_covered: (s: ReturnType<typeof steps>): Array<[ClaimEvent, C]> => [
    [s.coreShipped(), 'in_transit'],
    [s.coreReceived(), 'received'],
    [s.inspect('not_covered'), 'inspected'],
  ],
  waived_local_recycling: (s: ReturnType<typeof steps>): Array<[ClaimEvent, C]> => [[s.waive('local_recycling'), 'waived']],
  waived_scrapped_at_shop: (s: ReturnType<typeof steps>): Array<[ClaimEvent, C]> => [[s.waive('scrapped_at_shop'), 'waived']],
  written_off: (s: ReturnType<typeof steps>): Array<[ClaimEvent, C]> => [
    [s.remind(), 'requested'],
    [s.remind(), 'requested'],
    [s.writeOff(), 'written_off'],
  ],
};

// Expected chargebacks per core outcome (product brief: no fault found, damage not covered, or a core
// not returned lead to a chargeback).
const EXPECTED_CHARGEBACKS: Record<keyof typeof CORE_PATHS, string[]> = {
  fault_confirmed: [],
  no_fault_found: ['no_fault_found'],
  not_covered: ['not_covered'],
  waived_local_recycling: [],
  waived_scrapped_at_shop: [],
  written_off: ['core_not_returned'],
};

/** Interleave the two tracks: all replacement steps first, or all core steps first. */
function approvedTracks(
  replacement: Array<[ClaimEvent, R]>,
  core: Array<[ClaimEvent, C]>,
  coreFirst: boolean,
): Step[] {
  let r: R = 'to_ship';
  let c: C = 'requested';
  const value = (): ClaimStateValue => (r === 'verified' && CORE_DONE.includes(c) ? 'credit_pending' : approvedValue(r, c));
  const out: Step[] = [];
  const runR = () => replacement.forEach(([e, next]) => { r = next; out.push([e, value()]); });
  const runC = () => core.forEach(([e, next]) => { c = next; out.push([e, value()]); });
  if (coreFirst) { runC(); runR(); } else { runR(); runC(); }
  return out;
}

describe('draft to reconciled, every variant', () => {
  const preambles = ['direct', 'info_twice', 'appeal'] as const;
  const extents = ['full', 'partial'] as const;
  const cases = preambles.flatMap((pre) =>
    extents.flatMap((extent) =>
      (Object.keys(REPLACEMENT_PATHS) as Array<keyof typeof REPLACEMENT_PATHS>).flatMap((rp) =>
        (Object.keys(CORE_PATHS) as Array<keyof typeof CORE_PATHS>).map((cp) => ({ pre, extent, rp, cp })),
      ),
    ),
  );

  it.each(cases)('$pre review, $extent approval, replacement $rp, core $cp', ({ pre, extent, rp, cp }) => {
    const clock = new Clock();
    const s = steps(clock);
    const approver = pre === 'appeal' ? PEOPLE.rep2 : PEOPLE.rep1;
    const coreFirst = (rp.length + cp.length) % 2 === 0;
    const path: Step[] = [
      ...reviewPreamble(s, pre),
      [extent === 'full' ? s.approveFull(approver) : s.approvePartial(approver), approvedValue('to_ship', 'requested')],
      ...approvedTracks(REPLACEMENT_PATHS[rp](s), CORE_PATHS[cp](s), coreFirst),
      [s.credit(), 'credited'],
      [s.reconcile(), 'reconciled'],
    ];
    const end = drive(path);
    const ctx = end.context;

    expect(snapshotOf(end).status).toBe('done');
    expect(ctx.decision).toMatchObject({ outcome: extent, by: approver.id, reasonCode: null });
    expect(ctx.rmaNumber).toBe(extent === 'full' ? 'LP-RMA-0042' : 'LP-RMA-0043');
    expect(ctx.approvedLines.map((l) => l.approved)).toEqual(extent === 'full' ? [true, true] : [true, false]);
    expect(ctx.chargebackReasons).toEqual(EXPECTED_CHARGEBACKS[cp]);
    expect(ctx.creditMemoId).toBe('memo-5001');
    expect(ctx.statementLineRef).toBe('stmt-2026-03-line-14');
    expect(ctx.replacement).toMatchObject({ carrier: 'Northway Freight', trackingNumber: 'NW-77001', shippedBy: PEOPLE.warehouse.id });

    const afterTest = {
      passes_first_time: { outcome: 'passed', attempts: 1, lastTestId: 'test-after-1', acceptedBy: null },
      fails_then_accepted_by_hand: { outcome: 'accepted_by_hand', attempts: 1, acceptedBy: PEOPLE.rep1.id },
      fails_then_new_pass: { outcome: 'passed', attempts: 3, lastTestId: 'test-after-3', acceptedBy: null },
    }[rp];
    expect(ctx.afterTest).toMatchObject(afterTest);
    if (rp === 'fails_then_accepted_by_hand') {
      expect(ctx.afterTest.acceptedReason).toBe('Roller slipped; the road test shows full assist.');
    }

    const coreOutcome = cp.startsWith('waived') ? 'waived' : cp === 'written_off' ? 'written_off' : 'inspected';
    expect(ctx.core.outcome).toBe(coreOutcome);
    if (coreOutcome === 'inspected') expect(ctx.core.inspection?.result).toBe(cp);
    if (coreOutcome === 'waived') {
      expect(ctx.core.waiver).toMatchObject({ reason: cp.replace('waived_', ''), proofAttachmentId: 'att-recycling-slip', by: PEOPLE.rep1.id });
    }
    if (coreOutcome === 'written_off') expect(ctx.core.remindersSent).toBe(2);
    if (cp === 'fault_confirmed') expect(ctx.core).toMatchObject({ labelRef: 'label-991', dangerousGoods: true });

    if (pre === 'info_twice') {
      expect(ctx.infoRequests).toMatchObject({ count: 2, lastChecklist: ['Battery label photo', 'Charger model'], lastBy: PEOPLE.rep1.id });
      expect(ctx.evidence?.photos).toBe(4);
    } else {
      expect(ctx.infoRequests.count).toBe(0);
    }
    if (pre === 'appeal') {
      expect(ctx).toMatchObject({ appealsUsed: 1, deniedByRepId: PEOPLE.rep1.id, assignedRepId: PEOPLE.rep2.id });
    } else {
      expect(ctx).toMatchObject({ appealsUsed: 0, deniedByRepId: null, assignedRepId: PEOPLE.rep1.id });
    }
  });
});

describe('the credit waits for both tracks (parallel state, onDone)', () => {
  it('a finished core alone does not move the claim to credit pending', () => {
    const s = steps(new Clock());
    const end = drive([
      [s.submit(), 'submitted'],
      [s.take(), 'in_review'],
      [s.approveFull(), approvedValue('to_ship', 'requested')],
      [s.waive(), approvedValue('to_ship', 'waived')],
      [s.ship(), approvedValue('shipped', 'waived')],
      [s.fitted(false), approvedValue('fitted', 'waived')],
    ]);
    expect(snapshotOf(end).can(s.credit())).toBe(false);
    drive([[s.afterTest(true), 'credit_pending']], end);
  });

  it('a verified replacement alone does not move the claim to credit pending', () => {
    const s = steps(new Clock());
    const end = drive([
      [s.submit(), 'submitted'],
      [s.take(), 'in_review'],
      [s.approveFull(), approvedValue('to_ship', 'requested')],
      [s.ship(), approvedValue('shipped', 'requested')],
      [s.fitted(true), approvedValue('verified', 'requested')],
      [s.coreShipped(), approvedValue('verified', 'in_transit')],
      [s.coreReceived(), approvedValue('verified', 'received')],
    ]);
    expect(snapshotOf(end).can(s.credit())).toBe(false);
    drive([[s.inspect('fault_confirmed'), 'credit_pending']], end);
  });

  it('the warehouse may receive a core the dealer never marked shipped', () => {
    const s = steps(new Clock());
    const end = drive([
      [s.submit(), 'submitted'],
      [s.take(), 'in_review'],
      [s.approveFull(), approvedValue('to_ship', 'requested')],
      [s.coreReceived(), approvedValue('to_ship', 'received')],
    ]);
    expect(end.context.core).toMatchObject({ shippedAt: null, condition: 'sound', receivedBy: PEOPLE.warehouse.id });
  });
});

describe('denials and appeals', () => {
  it('denial → appeal → deny again: no second appeal, the claim stays denied', () => {
    const s = steps(new Clock());
    const end = drive([
      [s.submit(), 'submitted'],
      [s.take(), 'in_review'],
      [s.deny(), 'denied'],
      [s.appeal(PEOPLE.dealer_admin), 'appealed'],
      [s.take(PEOPLE.rep2), 'in_review'],
      [s.deny(PEOPLE.rep2), 'denied'],
    ]);
    expect(end.context).toMatchObject({ appealsUsed: 1, deniedByRepId: PEOPLE.rep2.id, assignedRepId: null });
    expect(end.context.decision).toMatchObject({ outcome: 'denied', reasonCode: 'water_ingress', by: PEOPLE.rep2.id });
    const again = s.appeal();
    const snap = snapshotOf(end);
    expect(snap.can(again)).toBe(false);
    expect(explainRefusal(snap, again)).toBe('A denial can be appealed once; this claim was appealed already.');
  });

  it('a brand with a single rep: the rep who denied may take the appeal when the server says there is no other', () => {
    const s = steps(new Clock());
    const end = drive([
      [s.submit(), 'submitted'],
      [s.take(), 'in_review'],
      [s.deny(), 'denied'],
      [s.appeal(), 'appealed'],
    ]);
    const snap = snapshotOf(end);
    expect(snap.can(s.take(PEOPLE.rep1))).toBe(false);
    expect(snap.can(s.take(PEOPLE.rep1, false))).toBe(false);
    drive([[s.take(PEOPLE.rep1, true), 'in_review']], end);
  });

  it('an appeal is accepted up to the last moment of the window and not after', () => {
    const s = steps(new Clock());
    const denied = drive([
      [s.submit(), 'submitted'],
      [s.take(), 'in_review'],
      [s.deny(PEOPLE.rep1, '2026-03-14T23:59:59.000Z'), 'denied'],
    ]);
    const snap = snapshotOf(denied);
    const base = { type: 'APPEAL', actor: PEOPLE.dealer, message: 'Please look again.' } as const;
    expect(snap.can({ ...base, at: '2026-03-14T23:59:59.000Z' })).toBe(true);
    expect(snap.can({ ...base, at: '2026-03-15T00:00:00.000Z' })).toBe(false);
    // Same instant written with another offset: still inside.
    expect(snap.can({ ...base, at: '2026-03-15T01:59:59.000+02:00' })).toBe(true);
    expect(explainRefusal(snap, { ...base, at: '2026-03-15T08:00:00.000Z' })).toBe('The appeal window closed on 2026-03-14 at 23:59 UTC.');
  });
});

describe('release and withdrawal', () => {
  it('a released claim goes back to the pool it came from', () => {
    const s = steps(new Clock());
    const end = drive([
      [s.submit(), 'submitted'],
      [s.take(), 'in_review'],
      [s.release(), 'submitted'],
      [s.take(PEOPLE.rep2), 'in_review'],
      [s.deny(PEOPLE.rep2), 'denied'],
      [s.appeal(), 'appealed'],
      [s.take(PEOPLE.rep1), 'in_review'],
      [s.release(PEOPLE.rep1), 'appealed'],
    ]);
    expect(end.context.assignedRepId).toBeNull();
    expect(end.context.deniedByRepId).toBe(PEOPLE.rep2.id);
  });

  const before = (s: ReturnType<typeof steps>) => ({
    draft: [] as Step[],
    submitted: [[s.submit(), 'submitted']] as Step[],
    in_review: [[s.submit(), 'submitted'], [s.take(), 'in_review']] as Step[],
    waiting_on_dealer: [[s.submit(), 'submitted'], [s.take(), 'in_review'], [s.requestInfo(), 'waiting_on_dealer']] as Step[],
    appealed: [[s.submit(), 'submitted'], [s.take(), 'in_review'], [s.deny(), 'denied'], [s.appeal(), 'appealed']] as Step[],
  });

  it.each(['draft', 'submitted', 'in_review', 'waiting_on_dealer', 'appealed'] as const)(
    'the dealer withdraws from %s; nothing more can happen after',
    (from) => {
      const s = steps(new Clock());
      const end = drive([...before(s)[from], [s.withdraw(PEOPLE.dealer_admin), 'withdrawn']]);
      expect(end.context.withdrawal).toMatchObject({ by: PEOPLE.dealer_admin.id, note: 'Customer fixed it elsewhere' });
      const snap = snapshotOf(end);
      expect(snap.status).toBe('done');
      for (const e of [s.submit(), s.take(), s.withdraw(), s.appeal()]) expect(snap.can(e)).toBe(false);
    },
  );
});

describe('core write-off needs a reminder first (clock decided by the server)', () => {
  function approved(): { stored: StoredClaim; s: ReturnType<typeof steps> } {
    const s = steps(new Clock());
    const stored = drive([
      [s.submit(), 'submitted'],
      [s.take(), 'in_review'],
      [s.approveFull(), approvedValue('to_ship', 'requested')],
    ]);
    return { stored, s };
  }

  it('no write-off without a reminder', () => {
    const { stored, s } = approved();
    const e = s.writeOff();
    expect(snapshotOf(stored).can(e)).toBe(false);
    expect(explainRefusal(snapshotOf(stored), e)).toMatch(/not been reminded/);
  });

  it('no write-off dated at or before the reminder', () => {
    const { stored, s } = approved();
    const reminded = drive([[s.remind(), approvedValue('to_ship', 'requested')]], stored);
    const at = reminded.context.core.lastReminderAt ?? '';
    const e = { type: 'WRITE_OFF_CORE', actor: PEOPLE.system, at } as const;
    expect(snapshotOf(reminded).can(e)).toBe(false);
    expect(snapshotOf(reminded).can({ ...e, at: new Date(Date.parse(at) + 1).toISOString() })).toBe(true);
  });

  it('appeal window end given far ahead is kept as given', () => {
    const s = steps(new Clock());
    const end = drive([
      [s.submit(), 'submitted'],
      [s.take(), 'in_review'],
      [s.deny(), 'denied'],
    ]);
    expect(end.context.appealOpenUntil).toBe(APPEAL_WINDOW_END);
  });
});
