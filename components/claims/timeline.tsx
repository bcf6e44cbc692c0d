import { ROLE_LABELS, isRole } from '@/lib/auth/roles';
import { ATTACHMENT_LABELS, type AttachmentKind } from '@/lib/claims/attachment-rules';
import type { ClaimEventRow } from '@/lib/db/claims';
import { formatDateTime } from '@/lib/format/dates';
import { carrierName } from '@/lib/carrier/carriers';
import { CORE_CONDITION_LABELS, DENIAL_REASON_LABELS, describeState, EVENT_LABELS, INSPECTION_RESULT_LABELS, isClaimEventType, WAIVER_REASON_LABELS, type DenialReason } from '@/machines/claim';

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
    case 'RENUMBERED':
      return `Claim renumbered from ${String(e.payload.from ?? '')} to ${String(e.payload.to ?? '')}`;
    case 'REPLACEMENT_DELIVERED':
      return 'Replacement delivered by the carrier';
    case 'CORE_PARCEL_DELIVERED':
      return 'Core parcel delivered to the warehouse';
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

/** What a shipping or core step recorded: carrier and tracking, condition, result and notes. */
function fulfilmentDetail(e: ClaimEventRow): string | null {
  const p = e.payload;
  const parts: string[] = [];
  if (typeof p.carrier === 'string' && typeof p.trackingNumber === 'string') parts.push(`${carrierName(p.carrier)} ${p.trackingNumber}`);
  if (e.event === 'ISSUE_RETURN_LABEL' && typeof p.labelRef === 'string') parts.push(`label ${p.labelRef}${p.batteryCondition === 'damaged_or_defective' ? ', damaged battery, ground only' : ''}`);
  if (typeof p.condition === 'string' && p.condition in CORE_CONDITION_LABELS) parts.push(CORE_CONDITION_LABELS[p.condition as keyof typeof CORE_CONDITION_LABELS]);
  if (typeof p.result === 'string' && p.result in INSPECTION_RESULT_LABELS) parts.push(INSPECTION_RESULT_LABELS[p.result as keyof typeof INSPECTION_RESULT_LABELS]);
  if (typeof p.reason === 'string' && p.reason in WAIVER_REASON_LABELS) parts.push(WAIVER_REASON_LABELS[p.reason as keyof typeof WAIVER_REASON_LABELS]);
  if (typeof p.notes === 'string' && p.notes) parts.push(`“${p.notes}”`);
  return parts.length ? parts.join(' · ') : null;
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
            {Array.isArray(e.payload.checklist) ? (
              <ul className="mt-1 list-disc pl-5 text-sm">{(e.payload.checklist as string[]).map((c) => <li key={c}>{c}</li>)}</ul>
            ) : null}
            {e.event === 'APPROVE' && typeof e.payload.rmaNumber === 'string' ? <p className="text-sm">{e.payload.extent === 'partial' ? 'In part' : 'In full'} · RMA <span className="font-mono">{e.payload.rmaNumber}</span></p> : null}
            {e.event === 'DENY' && typeof e.payload.reasonCode === 'string' ? <p className="text-sm">{DENIAL_REASON_LABELS[e.payload.reasonCode as DenialReason] ?? e.payload.reasonCode}</p> : null}
            {typeof e.payload.message === 'string' && e.payload.message ? <p className="mt-1 whitespace-pre-wrap rounded-md bg-paper-sunk px-3 py-2 text-sm">{e.payload.message}</p> : null}
            {typeof e.payload.note === 'string' && e.payload.note ? <p className="mt-1 text-sm text-ink-soft">“{e.payload.note}”</p> : null}
            {fulfilmentDetail(e) ? <p className="mt-1 text-sm text-ink-soft">{fulfilmentDetail(e)}</p> : null}
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
