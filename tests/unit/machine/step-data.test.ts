// Bad data on an otherwise allowed step is refused, nothing changes, and the message names the field.
// The rules are the lifecycle assignment's (approval lines, denial reasons, inspection results, waivers).
import { describe, expect, it } from 'vitest';
import {
  explainRefusal,
  initialClaimSnapshot,
  restoreClaim,
  stepClaim,
  type ClaimEvent,
  type ClaimStateValue,
  type StoredClaim,
} from '@/machines/claim';
import { approvedValue, Clock, drive, PEOPLE, snapshotOf, steps } from './support';

type Step = [ClaimEvent, ClaimStateValue];

function reach(path: (s: ReturnType<typeof steps>) => Step[]): StoredClaim {
  return drive(path(steps(new Clock())));
}

const T = '2026-05-01T10:00:00Z';
const rep = PEOPLE.rep1;
const wh = PEOPLE.warehouse;

const review = reach((s) => [[s.submit(), 'submitted'], [s.take(rep), 'in_review']]);
const approved = reach((s) => [[s.submit(), 'submitted'], [s.take(rep), 'in_review'], [s.approveFull(), approvedValue('to_ship', 'requested')]]);
const shipped = drive([[steps(new Clock()).ship({ ...wh }), approvedValue('shipped', 'requested')]], approved);
const received = drive(
  [[{ type: 'CORE_RECEIVED', actor: wh, at: T, condition: 'sound' }, approvedValue('to_ship', 'received')]],
  approved,
);
const credit = reach((s) => [
  [s.submit(), 'submitted'],
  [s.take(rep), 'in_review'],
  [s.approveFull(), approvedValue('to_ship', 'requested')],
  [s.ship(), approvedValue('shipped', 'requested')],
  [s.fitted(true), approvedValue('verified', 'requested')],
  [s.waive(), 'credit_pending'],
]);

const cases: Array<[string, StoredClaim, unknown, string | RegExp]> = [
  ['submit without evidence', reach(() => []), { type: 'SUBMIT', actor: PEOPLE.dealer, at: T }, 'The evidence summary is missing.'],
  [
    'request info with an empty checklist',
    review,
    { type: 'REQUEST_INFO', actor: rep, at: T, checklist: [], message: 'More please' },
    'The checklist needs at least one item the dealer must send.',
  ],
  ['request info with a blank item', review, { type: 'REQUEST_INFO', actor: rep, at: T, checklist: ['  '], message: 'x' }, 'A checklist item is empty.'],
  ['request info without a message', review, { type: 'REQUEST_INFO', actor: rep, at: T, checklist: ['Photo'] }, 'The message to the dealer is missing.'],
  [
    'full approval with a line not approved',
    review,
    { type: 'APPROVE', actor: rep, at: T, extent: 'full', rmaNumber: 'R-1', lines: [{ lineId: 'p1', approved: true }, { lineId: 'f1', approved: false }] },
    'A full approval must approve every line; line "f1" is not approved.',
  ],
  [
    'partial approval with every line approved',
    review,
    { type: 'APPROVE', actor: rep, at: T, extent: 'partial', rmaNumber: 'R-1', lines: [{ lineId: 'p1', approved: true }] },
    'Every line is approved, so this is a full approval, not a partial one.',
  ],
  [
    'full approval with a line approved for less than requested',
    review,
    { type: 'APPROVE', actor: rep, at: T, extent: 'full', rmaNumber: 'R-1', lines: [{ lineId: 'p1', approved: true, changed: true }] },
    'A full approval approves every line as requested; line "p1" was changed, so this is a partial approval.',
  ],
  [
    'approval with a non-boolean "changed"',
    review,
    { type: 'APPROVE', actor: rep, at: T, extent: 'partial', rmaNumber: 'R-1', lines: [{ lineId: 'p1', approved: true, changed: 'yes' }] },
    'Each line\'s "changed" must be true or false.',
  ],
  [
    'approval approving nothing',
    review,
    { type: 'APPROVE', actor: rep, at: T, extent: 'partial', rmaNumber: 'R-1', lines: [{ lineId: 'p1', approved: false }] },
    'An approval must approve at least one line; deny the claim instead.',
  ],
  [
    'approval with a line twice',
    review,
    { type: 'APPROVE', actor: rep, at: T, extent: 'full', rmaNumber: 'R-1', lines: [{ lineId: 'p1', approved: true }, { lineId: 'p1', approved: true }] },
    'Line "p1" appears twice.',
  ],
  ['approval with no lines', review, { type: 'APPROVE', actor: rep, at: T, extent: 'full', rmaNumber: 'R-1', lines: [] }, 'An approval needs at least one line.'],
  [
    'approval without an RMA number',
    review,
    { type: 'APPROVE', actor: rep, at: T, extent: 'full', rmaNumber: ' ', lines: [{ lineId: 'p1', approved: true }] },
    'The RMA number is empty.',
  ],
  [
    'approval with an unknown extent',
    review,
    { type: 'APPROVE', actor: rep, at: T, extent: 'most', rmaNumber: 'R', lines: [{ lineId: 'p1', approved: true }] },
    'The approval extent must be one of: full, partial.',
  ],
  [
    'denial with a reason not on our list',
    review,
    { type: 'DENY', actor: rep, at: T, reasonCode: 'bad_luck', message: 'x', appealOpenUntil: '2026-06-01T00:00:00Z' },
    /^The denial reason must be one of: out_of_coverage, unregistered_no_proof, /,
  ],
  [
    'denial with an appeal window that ends before it',
    review,
    { type: 'DENY', actor: rep, at: T, reasonCode: 'wear_item', message: 'x', appealOpenUntil: '2026-04-30T00:00:00Z' },
    'The end of the appeal window ("appealOpenUntil") must be after the denial.',
  ],
  [
    'denial with a malformed window',
    review,
    { type: 'DENY', actor: rep, at: T, reasonCode: 'wear_item', message: 'x', appealOpenUntil: '14/03/2026' },
    /appealOpenUntil.*ISO 8601/,
  ],
  ['denial without a message', review, { type: 'DENY', actor: rep, at: T, reasonCode: 'wear_item', message: '', appealOpenUntil: '2026-06-01T00:00:00Z' }, 'The message to the dealer is empty.'],
  ['shipping without a carrier', approved, { type: 'SHIP', actor: wh, at: T, trackingNumber: 'NW-1' }, 'The carrier is missing.'],
  ['shipping with a blank tracking number', approved, { type: 'SHIP', actor: wh, at: T, carrier: 'C', trackingNumber: '' }, 'The tracking number is empty.'],
  ['fitting without the after-test verdict', shipped, { type: 'MARK_FITTED', actor: PEOPLE.dealer, at: T, afterTestId: 'a1' }, '"afterTestPasses" must be true or false.'],
  ['fitting without the after-test', shipped, { type: 'MARK_FITTED', actor: PEOPLE.dealer, at: T, afterTestPasses: true }, 'The after-test ("afterTestId") is missing.'],
  ['receiving a core in an unknown condition', approved, { type: 'CORE_RECEIVED', actor: wh, at: T, condition: 'wet' }, 'The core condition must be one of: sound, transit_damage, incomplete.'],
  ['no fault found without notes', received, { type: 'INSPECT', actor: wh, at: T, result: 'no_fault_found' }, /notes are required when the fault is not confirmed/],
  ['damage not covered with blank notes', received, { type: 'INSPECT', actor: wh, at: T, result: 'not_covered', notes: ' ' }, /notes are required/],
  ['an unknown inspection result', received, { type: 'INSPECT', actor: wh, at: T, result: 'maybe' }, 'The inspection result must be one of: fault_confirmed, no_fault_found, not_covered.'],
  ['waiver without proof', approved, { type: 'WAIVE_CORE', actor: rep, at: T, reason: 'local_recycling' }, 'The proof of disposal ("proofAttachmentId") is missing.'],
  ['waiver with another reason', approved, { type: 'WAIVE_CORE', actor: rep, at: T, reason: 'lost', proofAttachmentId: 'a' }, 'The waiver reason must be one of: local_recycling, scrapped_at_shop.'],
  ['credit without a memo id', credit, { type: 'ISSUE_CREDIT', actor: PEOPLE.accountant, at: T, memoId: '' }, 'The credit memo id ("memoId") is empty.'],
];

describe('bad step data is refused with the field named', () => {
  it.each(cases)('%s', (_name, stored, event, message) => {
    const snap = snapshotOf(stored);
    expect(snap.can(event as ClaimEvent)).toBe(false);
    const why = explainRefusal(snap, event);
    if (typeof message === 'string') expect(why).toBe(message);
    else expect(why).toMatch(message);
    const result = stepClaim(stored, event as ClaimEvent);
    expect(result).toEqual({ ok: false, from: stored.value, refusal: why });
  });

  it('a passing inspection needs no notes', () => {
    const snap = snapshotOf(received);
    expect(snap.can({ type: 'INSPECT', actor: wh, at: T, result: 'fault_confirmed' })).toBe(true);
  });
});

describe('stored claims', () => {
  it('initialClaimSnapshot gives a JSON-safe draft', () => {
    const stored = initialClaimSnapshot({ openedBy: PEOPLE.dealer_admin, openedAt: '2026-02-02T08:00:00Z' });
    expect(stored.value).toBe('draft');
    expect(JSON.parse(JSON.stringify(stored))).toStrictEqual(stored);
    expect(stored.context).toMatchObject({
      openedBy: PEOPLE.dealer_admin,
      assignedRepId: null,
      appealsUsed: 0,
      infoRequests: { count: 0, lastChecklist: [] },
      chargebackReasons: [],
      creditMemoId: null,
    });
  });

  it('initialClaimSnapshot refuses a bad opener or time', () => {
    expect(() => initialClaimSnapshot({ openedBy: PEOPLE.warehouse, openedAt: '2026-02-02T08:00:00Z' })).toThrow(/opened by a dealer user/);
    expect(() => initialClaimSnapshot({ openedBy: PEOPLE.dealer, openedAt: '2 Feb' })).toThrow(/"openedAt"/);
  });

  it('restoreClaim refuses a stored value that is not a state', () => {
    const stored = initialClaimSnapshot({ openedBy: PEOPLE.dealer, openedAt: '2026-02-02T08:00:00Z' });
    expect(() => restoreClaim({ value: 'archived', context: stored.context })).toThrow('Unknown claim state "archived".');
    expect(() => restoreClaim({ value: 'draft', context: null })).toThrow(/context must be an object/);
  });

  it('a partial approval may approve every line when one of them is approved for less than requested', () => {
    const result = stepClaim(review, {
      type: 'APPROVE', actor: rep, at: T, extent: 'partial', rmaNumber: 'R-2',
      lines: [{ lineId: 'p1', approved: true, changed: true, note: 'quantity 2 → 1' }, { lineId: 'l1', approved: true }],
    });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.stored.context.decision?.outcome).toBe('partial');
    expect(result.stored.context.approvedLines).toEqual([
      { lineId: 'p1', approved: true, changed: true, note: 'quantity 2 → 1' },
      { lineId: 'l1', approved: true },
    ]);
  });

  it('stepClaim returns the next stored claim and leaves the input untouched', () => {
    const start = initialClaimSnapshot({ openedBy: PEOPLE.dealer, openedAt: '2026-02-02T08:00:00Z' });
    const before = JSON.stringify(start);
    const s = steps(new Clock());
    const result = stepClaim(start, s.submit());
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.from).toBe('draft');
    expect(result.to).toBe('submitted');
    expect(result.stored.context.submittedAt).not.toBeNull();
    expect(JSON.stringify(start)).toBe(before);
    const refused = stepClaim(result.stored, s.approveFull());
    expect(refused).toEqual({ ok: false, from: 'submitted', refusal: 'Take this claim for review first.' });
  });
});
