import { describe, expect, it } from 'vitest';
import { appealOf, sinceLastRequest, threadOf, type LogEntry } from '@/lib/review';

let id = 0;
const at = (minute: number) => new Date(Date.UTC(2026, 11, 1, 9, minute));
const e = (event: string, minute: number, payload: Record<string, unknown> = {}, role = 'dealer'): LogEntry => ({
  id: ++id, event, actorName: role === 'dealer' ? 'Shop person' : 'Rep person', actorRole: role, createdAt: at(minute), payload,
});

describe('what changed since the request for more', () => {
  const log = [
    e('SUBMIT', 0),
    e('EVIDENCE_ADDED', 1, { attachmentId: 'a-before' }),
    e('TAKE', 2, {}, 'brand_rep'),
    e('REQUEST_INFO', 3, { checklist: ['More photos: the pins'], message: 'Pins, please.' }, 'brand_rep'),
    e('EVIDENCE_ADDED', 4, { attachmentId: 'a-new' }),
    e('MESSAGE', 5, { message: 'On its way.' }),
    e('RESUBMIT', 6, { message: 'Attached.' }),
    e('EVIDENCE_ADDED', 8, { attachmentId: 'a-after-decision' }),
  ];

  it('lists the evidence and messages after the last request, and when the dealer answered', () => {
    const s = sinceLastRequest(log)!;
    expect(s.checklist).toEqual(['More photos: the pins']);
    expect(s.message).toBe('Pins, please.');
    expect(s.attachmentIds).toEqual(['a-new', 'a-after-decision']);
    expect(s.messages.map((m) => m.text)).toEqual(['On its way.', 'Attached.']);
    expect(s.resubmittedAt).toBe(at(6).toISOString());
  });

  it('stops at the next decision, and is empty without a request', () => {
    const decided = [...log.slice(0, 7), e('APPROVE', 7, {}, 'brand_rep'), log[7]!];
    expect(sinceLastRequest(decided)!.attachmentIds).toEqual(['a-new']);
    expect(sinceLastRequest(log.slice(0, 3))).toBeNull();
  });
});

describe('the appeal under review', () => {
  it('pairs the appeal with the denial it answers and the evidence added since', () => {
    const log = [
      e('SUBMIT', 0),
      e('DENY', 10, { reasonCode: 'water_ingress', message: 'Corrosion.' }, 'brand_rep'),
      e('EVIDENCE_ADDED', 11, { attachmentId: 'for-appeal' }),
      e('APPEAL', 12, { message: 'Seal intact.' }),
      e('TAKE', 13, {}, 'brand_rep'),
    ];
    expect(appealOf(log)).toEqual({
      deniedAt: at(10).toISOString(), deniedBy: 'Rep person', reasonCode: 'water_ingress', denialMessage: 'Corrosion.',
      appealedAt: at(12).toISOString(), appealMessage: 'Seal intact.', attachmentIds: ['for-appeal'],
    });
    expect(appealOf(log.slice(0, 3))).toBeNull();
  });
});

describe('the thread', () => {
  it('is every entry with a message, steps included, oldest first; blank messages are left out', () => {
    const log = [e('REQUEST_INFO', 1, { message: 'Need a log.' }, 'brand_rep'), e('MESSAGE', 2, { message: '  ' }), e('MESSAGE', 3, { message: 'Sent.' }), e('TAKE', 4)];
    expect(threadOf(log).map((t) => [t.event, t.text])).toEqual([['REQUEST_INFO', 'Need a log.'], ['MESSAGE', 'Sent.']]);
  });
});
