import { describe, expect, it } from 'vitest';
import {
  appealWindowEnd, approvalRate, approvalRateText, buildApproval, checklistFrom, compareLines, DEFAULT_APPEAL_DAYS, describeChange,
  draftFromRequest, hoursText, hundredthsOf, type ClaimLines, type ScheduleOperation,
} from '@/lib/review';

// Invented demo lines and schedule; the figures are ours.
const schedule: ScheduleOperation[] = [
  { id: 'op-du', code: 'DU-RR', description: 'Remove and refit drive unit', standardHours: '1.20', active: true },
  { id: 'op-lt', code: 'LT-BA', description: 'Load test before and after', standardHours: '0.80', active: true },
  { id: 'op-ct', code: 'CT-RR', description: 'Replace controller', standardHours: '0.80', active: true },
  { id: 'op-old', code: 'OLD-1', description: 'Retired operation', standardHours: '2.00', active: false },
];
const requested: ClaimLines = {
  parts: [{ lineId: 'p1', partId: 'part-du85', partNumber: 'TV-DU85', name: 'Drive unit', quantity: 2, fromDealerStock: false }],
  labor: [
    { lineId: 'l1', operationId: 'op-du', code: 'DU-RR', description: 'Remove and refit drive unit', hours: '1.20' },
    { lineId: 'l2', operationId: 'op-lt', code: 'LT-BA', description: 'Load test before and after', hours: '0.80' },
  ],
  freightMinor: 1850,
};
const draft = () => draftFromRequest(requested, 'EUR');

describe('hours as exact hundredths', () => {
  it.each([['1.20', 120], ['1.2', 120], ['0.05', 5], ['3', 300], [2.5, 250], ['0', 0]])('%s → %d', (text, h) => expect(hundredthsOf(text)).toBe(h));
  it.each(['-1', '1.205', 'one', '', '1e2', '1,5'])('refuses %j', (text) => expect(hundredthsOf(text)).toBeNull());
  it('prints the schedule form', () => expect([hoursText(120), hoursText(5), hoursText(300)]).toEqual(['1.20', '0.05', '3.00']));
});

describe('building an approval from the rep’s answers', () => {
  it('every line as requested is a full approval, with the approved lines equal to the request', () => {
    const r = buildApproval(requested, draft(), schedule, 'EUR');
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.extent).toBe('full');
    expect(r.approved).toEqual(requested);
    expect(r.lines).toEqual([{ lineId: 'p1', approved: true }, { lineId: 'l1', approved: true }, { lineId: 'l2', approved: true }, { lineId: 'freight', approved: true }]);
  });

  it('fewer parts, another operation, a line dropped and less freight make a partial approval, each change described', () => {
    const d = draft();
    d.parts[0]!.quantity = 1;
    d.labor[0] = { lineId: 'l1', operationId: 'op-ct', hours: '0.5' };
    d.labor[1]!.hours = '0';
    d.freight = '9,99';
    const r = buildApproval(requested, d, schedule, 'EUR');
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.extent).toBe('partial');
    expect(r.approved).toEqual({
      parts: [{ ...requested.parts[0], quantity: 1 }],
      labor: [{ lineId: 'l1', operationId: 'op-ct', code: 'CT-RR', description: 'Replace controller', hours: '0.50' }],
      freightMinor: 999,
    });
    expect(r.lines).toEqual([
      { lineId: 'p1', approved: true, changed: true, note: 'TV-DU85: quantity 2 → 1' },
      { lineId: 'l1', approved: true, changed: true, note: 'DU-RR 1.20 h → CT-RR 0.50 h' },
      { lineId: 'l2', approved: false, note: 'LT-BA: not approved (asked 0.80 h)' },
      { lineId: 'freight', approved: true, changed: true, note: 'Freight: 18.50 EUR → 9.99 EUR' },
    ]);
  });

  it('hours written differently but equal ("1.2" for "1.20") are not a change', () => {
    const d = draft();
    d.labor[0]!.hours = '1.2';
    const r = buildApproval(requested, d, schedule, 'EUR');
    expect(r.ok && r.extent).toBe('full');
  });

  it('keeps a retired operation on the line that asked for it, but refuses it as a replacement', () => {
    const withOld: ClaimLines = { ...requested, labor: [{ lineId: 'l1', operationId: 'op-old', code: 'OLD-1', description: 'Retired operation', hours: '2.00' }] };
    expect(buildApproval(withOld, draftFromRequest(withOld, 'EUR'), schedule, 'EUR').ok).toBe(true);
    const d = draft();
    d.labor[0] = { lineId: 'l1', operationId: 'op-old', hours: '1' };
    const r = buildApproval(requested, d, schedule, 'EUR');
    expect(!r.ok && r.fieldErrors['labor.0.operationId']).toEqual(['Not an operation in the brand’s labor schedule; choose one from the list.']);
  });

  it('refuses, field by field, everything a partial approval must not contain', () => {
    const d = draft();
    d.parts[0]!.quantity = -1;
    d.labor[0]!.hours = '1.21';
    d.labor[1] = { lineId: 'l2', operationId: 'op-nope', hours: '0.5' };
    d.freight = '18.51';
    const r = buildApproval(requested, d, schedule, 'EUR');
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.fieldErrors).toEqual({
      'parts.0.quantity': ['A quantity cannot be negative.'],
      'labor.0.hours': ['At most 1.20 h, the scheduled time for DU-RR.'],
      'labor.1.operationId': ['Not an operation in the brand’s labor schedule; choose one from the list.'],
      freight: ['At most 18.50 EUR: what the dealer asked for.'],
    });
  });

  it.each([
    [(d: ReturnType<typeof draft>) => void (d.parts[0]!.quantity = 3), 'parts.0.quantity', 'At most 2: the dealer asked for 2.'],
    [(d: ReturnType<typeof draft>) => void (d.parts[0]!.quantity = 0.5), 'parts.0.quantity', 'Whole parts only.'],
    [(d: ReturnType<typeof draft>) => void (d.parts[0]!.quantity = Number.NaN), 'parts.0.quantity', 'Enter a quantity (0 if the part is not approved).'],
    [(d: ReturnType<typeof draft>) => void (d.labor[0]!.hours = '-0.5'), 'labor.0.hours', 'Hours cannot be negative.'],
    [(d: ReturnType<typeof draft>) => void (d.labor[0]!.hours = '1.205'), 'labor.0.hours', 'Hours like 0.80, with at most two decimals (0 if not approved).'],
    [(d: ReturnType<typeof draft>) => void (d.freight = '-1'), 'freight', 'Freight cannot be negative.'],
    [(d: ReturnType<typeof draft>) => void d.parts.push({ lineId: 'p9', quantity: 1 }), 'parts.1.lineId', 'This claim has no part line "p9".'],
    [(d: ReturnType<typeof draft>) => void d.parts.push({ lineId: 'p1', quantity: 1 }), 'parts.1.lineId', 'Part line "p1" is answered twice.'],
    [(d: ReturnType<typeof draft>) => void (d.parts = []), 'parts', 'Part line p1 (TV-DU85) has no quantity; enter 0 if it is not approved.'],
  ])('refuses a bad line (%#)', (spoil, field, message) => {
    const d = draft();
    spoil(d);
    const r = buildApproval(requested, d, schedule, 'EUR');
    expect(!r.ok && r.fieldErrors[field]).toEqual([message]);
  });

  it('refuses an approval that approves nothing; that is a denial', () => {
    const d = { parts: [{ lineId: 'p1', quantity: 0 }], labor: [{ lineId: 'l1', operationId: 'op-du', hours: '0' }, { lineId: 'l2', operationId: 'op-lt', hours: '0' }], freight: '' };
    const r = buildApproval(requested, d, schedule, 'EUR');
    expect(!r.ok && r.message).toBe('Nothing is approved; deny the claim instead.');
  });

  it('refuses freight when the dealer asked for none', () => {
    const none: ClaimLines = { ...requested, freightMinor: 0 };
    const d = draftFromRequest(none, 'EUR');
    expect(d.freight).toBe('');
    d.freight = '5';
    const r = buildApproval(none, d, schedule, 'EUR');
    expect(!r.ok && r.fieldErrors.freight).toEqual(['At most 0.00 EUR: what the dealer asked for.']);
  });
});

describe('comparing approved lines with the request', () => {
  it('before a decision every line reads as requested; a missing line reads not approved', () => {
    expect(compareLines(requested, null).every((c) => c.status === 'as_requested')).toBe(true);
    const approved: ClaimLines = { parts: [{ ...requested.parts[0]!, quantity: 1 }], labor: [requested.labor[0]!], freightMinor: 1850 };
    const c = compareLines(requested, approved);
    expect(c.map((x) => [x.lineId, x.status])).toEqual([['p1', 'changed'], ['l1', 'as_requested'], ['l2', 'not_approved'], ['freight', 'as_requested']]);
    expect(c.map((x) => describeChange(x, 'EUR'))).toEqual(['TV-DU85: quantity 2 → 1', null, 'LT-BA: not approved (asked 0.80 h)', null]);
  });

  it('names freight in the brand’s currency with its own minor units (JPY has none)', () => {
    const yen: ClaimLines = { parts: requested.parts, labor: [], freightMinor: 1500 };
    const [, f] = compareLines(yen, { ...yen, freightMinor: 900 });
    expect(describeChange(f!, 'JPY')).toBe('Freight: 1500 JPY → 900 JPY');
  });
});

describe('the checklist of a request for more', () => {
  it('turns ticked items into sentences the dealer reads', () => {
    expect(checklistFrom([{ key: 'photos', detail: 'the charge port' }, { key: 'proof_of_purchase', detail: 'ignored' }, { key: 'diagnostic_log', detail: '' }]))
      .toEqual({ ok: true, checklist: ['More photos: the charge port', 'Proof of purchase showing the retail sale date', 'A diagnostic log from the diagnostic tool'] });
  });
  it('refuses nothing ticked, and photos or "something else" without saying what', () => {
    expect(checklistFrom([])).toMatchObject({ ok: false, field: 'items' });
    expect(checklistFrom([{ key: 'photos', detail: '  ' }])).toEqual({ ok: false, field: 'detail.photos', message: 'Photos of what?' });
    expect(checklistFrom([{ key: 'other', detail: '' }])).toEqual({ ok: false, field: 'detail.other', message: 'What exactly?' });
  });
});

describe('the appeal window (calendar days from the denial)', () => {
  it('ends the same time of day appeal_days later', () => {
    expect(appealWindowEnd('2026-12-01T10:00:00Z', 30)).toBe('2026-12-31T10:00:00.000Z');
    expect(appealWindowEnd('2026-02-20T08:30:00Z', 21)).toBe('2026-03-13T08:30:00.000Z'); // 2026 is not a leap year
    expect(appealWindowEnd('2026-12-01T10:00:00Z', null)).toBe(appealWindowEnd('2026-12-01T10:00:00Z', DEFAULT_APPEAL_DAYS));
  });
  it('refuses nonsense', () => {
    expect(() => appealWindowEnd('yesterday', 30)).toThrow(RangeError);
    expect(() => appealWindowEnd('2026-12-01T10:00:00Z', 0)).toThrow(/appealDays/);
  });
});

describe('the dealer’s approval rate', () => {
  it('is approved out of decided, open and withdrawn not counted', () => {
    expect(approvalRate({ approved: 5, denied: 1 })).toBeCloseTo(5 / 6, 12);
    expect(approvalRateText({ approved: 5, denied: 1 })).toBe('83 % (5 of 6 decided)');
    expect(approvalRate({ approved: 0, denied: 0 })).toBeNull();
    expect(approvalRateText({ approved: 0, denied: 0 })).toBe('no decisions yet');
  });
});
