import { ROLE_LABELS, isRole } from '@/lib/auth/roles';
import { ATTACHMENT_LABELS, type AttachmentKind } from '@/lib/claims/attachment-rules';
import type { ClaimEventRow } from '@/lib/db/claims';
import { formatDateTime } from '@/lib/format/dates';
import { describeState, EVENT_LABELS, isClaimEventType } from '@/machines/claim';

function wording(e: ClaimEventRow): string {
  if (isClaimEventType(e.event)) return EVENT_LABELS[e.event].done;
  switch (e.event) {
    case 'OPENED':
      return `Claim ${String(e.payload.number ?? '')} opened as a draft`;
    case 'EVIDENCE_ADDED':
      return `Added ${ATTACHMENT_LABELS[e.payload.kind as AttachmentKind]?.toLowerCase() ?? 'a file'}: ${String(e.payload.fileName ?? '')}`;
    case 'EVIDENCE_REMOVED':
      return `Removed ${String(e.payload.fileName ?? 'a file')}`;
    case 'MESSAGE':
      return 'Message';
    case 'CREDIT_LINE_EDITED':
      return `Credit line ${String(e.payload.lineNo ?? '')} adjusted by the brand`;
    case 'CREDIT_MEMO_REISSUED':
      return `Corrected credit memo ${String(e.payload.number ?? '')} issued`;
    case 'MEMO_REVERSED':
      return `Memo ${String(e.payload.memo ?? '')} reversed by ${String(e.payload.reversal ?? '')}`;
    case 'CHARGEBACK_MEMO_ISSUED':
      return `Chargeback memo ${String(e.payload.number ?? '')} issued`;
    case 'STATEMENT_MATCHED':
      return `Memo ${String(e.payload.memo ?? '')} matched to the dealer's statement`;
    default:
      return e.event.replace(/_/g, ' ').toLowerCase();
  }
}

/** The claim's append-only log, oldest first: who, when, and what changed. */
export function Timeline({ events, timeZone }: { events: ClaimEventRow[]; timeZone: string }) {
  return (
    <ol className="relative space-y-4 border-l-2 border-paper-line pl-5" data-testid="timeline">
      {events.map((e) => {
        const changed = JSON.stringify(e.fromState) !== JSON.stringify(e.toState) && e.toState !== null;
        return (
          <li key={e.id} className="relative">
            <span className={`absolute -left-[27px] top-1.5 h-3 w-3 rounded-full border-2 border-paper ${changed ? 'bg-charge-500' : 'bg-ink-faint'}`} aria-hidden />
            <p className="font-bold">{wording(e)}</p>
            {changed ? <p className="text-sm text-charge-700">Now: {describeState(e.toState).label}</p> : null}
            {typeof e.payload.message === 'string' && e.payload.message ? <p className="mt-1 whitespace-pre-wrap rounded-md bg-paper-sunk px-3 py-2 text-sm">{e.payload.message}</p> : null}
            {typeof e.payload.note === 'string' && e.payload.note ? <p className="mt-1 text-sm text-ink-soft">“{e.payload.note}”</p> : null}
            <p className="text-xs text-ink-muted">
              {e.actorName ?? 'Loadproof'}
              {isRole(e.actorRole) ? ` · ${ROLE_LABELS[e.actorRole]}` : ''} · {formatDateTime(e.createdAt, timeZone)}
            </p>
          </li>
        );
      })}
    </ol>
  );
}
