// Reading the claim's event log for the review screens: what came after a request for more or a
// denial, and the thread of messages. Pure; the rows are the log as lib/db/claims lists it.
export type LogEntry = {
  id: number;
  event: string;
  actorName: string | null;
  actorRole: string;
  createdAt: Date | string;
  payload: Record<string, unknown>;
};

export type SinceRequest = {
  askedAt: string;
  askedBy: string | null;
  checklist: string[];
  message: string | null;
  /** Attachments added after the request, by id. */
  attachmentIds: string[];
  /** Messages written after the request, the resubmission's included. */
  messages: { id: number; by: string | null; role: string; at: string; text: string }[];
  resubmittedAt: string | null;
};

/** What changed since the last request for more: the evidence and messages that came after it. */
export function sinceLastRequest(events: LogEntry[]): SinceRequest | null {
  const lastIndex = events.map((e) => e.event).lastIndexOf('REQUEST_INFO');
  if (lastIndex < 0) return null;
  const ask = events[lastIndex]!;
  const after = events.slice(lastIndex + 1);
  const resubmit = after.find((e) => e.event === 'RESUBMIT') ?? null;
  // Only what the dealer did until the next decision belongs to this answer.
  const end = after.findIndex((e) => ['APPROVE', 'DENY', 'REQUEST_INFO', 'WITHDRAW'].includes(e.event));
  const window = end < 0 ? after : after.slice(0, end);
  return {
    askedAt: new Date(ask.createdAt).toISOString(),
    askedBy: ask.actorName,
    checklist: Array.isArray(ask.payload.checklist) ? (ask.payload.checklist as string[]) : [],
    message: typeof ask.payload.message === 'string' ? ask.payload.message : null,
    attachmentIds: window.filter((e) => e.event === 'EVIDENCE_ADDED').map((e) => String(e.payload.attachmentId)),
    messages: window
      .filter((e) => typeof e.payload.message === 'string' && e.payload.message && (e.event === 'MESSAGE' || e.event === 'RESUBMIT'))
      .map((e) => ({ id: e.id, by: e.actorName, role: e.actorRole, at: new Date(e.createdAt).toISOString(), text: String(e.payload.message) })),
    resubmittedAt: resubmit ? new Date(resubmit.createdAt).toISOString() : null,
  };
}

export type AppealView = {
  deniedAt: string;
  deniedBy: string | null;
  reasonCode: string | null;
  denialMessage: string | null;
  appealedAt: string;
  appealMessage: string | null;
  /** Evidence the dealer added after the denial, for the appeal. */
  attachmentIds: string[];
};

/** The appeal under review: the denial it answers, the dealer's message and the evidence added for it. */
export function appealOf(events: LogEntry[]): AppealView | null {
  const appealIndex = events.map((e) => e.event).lastIndexOf('APPEAL');
  if (appealIndex < 0) return null;
  const denyIndex = events.slice(0, appealIndex).map((e) => e.event).lastIndexOf('DENY');
  const deny = denyIndex >= 0 ? events[denyIndex]! : null;
  const appeal = events[appealIndex]!;
  const after = events.slice(denyIndex + 1);
  const end = after.findIndex((e) => ['APPROVE', 'DENY', 'REQUEST_INFO', 'WITHDRAW'].includes(e.event));
  return {
    deniedAt: deny ? new Date(deny.createdAt).toISOString() : '',
    deniedBy: deny?.actorName ?? null,
    reasonCode: typeof deny?.payload.reasonCode === 'string' ? deny.payload.reasonCode : null,
    denialMessage: typeof deny?.payload.message === 'string' ? deny.payload.message : null,
    appealedAt: new Date(appeal.createdAt).toISOString(),
    appealMessage: typeof appeal.payload.message === 'string' ? appeal.payload.message : null,
    attachmentIds: (end < 0 ? after : after.slice(0, end)).filter((e) => e.event === 'EVIDENCE_ADDED').map((e) => String(e.payload.attachmentId)),
  };
}

export type ThreadEntry = { id: number; event: string; by: string | null; role: string; at: string; text: string };

/** The claim's thread: every log entry that carries a message, oldest first. */
export function threadOf(events: LogEntry[]): ThreadEntry[] {
  return events
    .filter((e) => typeof e.payload.message === 'string' && (e.payload.message as string).trim() !== '')
    .map((e) => ({ id: e.id, event: e.event, by: e.actorName, role: e.actorRole, at: new Date(e.createdAt).toISOString(), text: String(e.payload.message) }));
}
