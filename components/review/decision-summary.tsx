import { LineComparisonTable } from '@/components/review/line-comparison';
import { Notice } from '@/components/ui/notice';
import { formatDateTime } from '@/lib/format/dates';
import { compareLines } from '@/lib/review';
import type { ClaimView } from '@/lib/services/claim-view';
import { DENIAL_REASON_LABELS } from '@/machines/claim';
import { nothingShipsText } from '@/lib/fulfilment';

/** The decision as it stands: approved (with the RMA and the lines against the request) or denied (with the reason). */
export function DecisionSummary({ view, audience, timeZone = 'UTC' }: { view: ClaimView; audience: 'dealer' | 'brand'; timeZone?: string }) {
  const { claim } = view;
  const d = claim.context.decision;
  if (!d) return null;
  if (d.outcome === 'denied') {
    return (
      <section className="card border-fault-500/40 p-5" data-testid="decision">
        <h2 className="text-fault-700">Denied: {d.reasonCode ? DENIAL_REASON_LABELS[d.reasonCode].toLowerCase() : 'no reason given'}</h2>
        {d.message ? <p className="mt-2 whitespace-pre-wrap rounded-md bg-paper-sunk px-3 py-2 text-sm">{d.message}</p> : null}
        <p className="mt-2 text-xs text-ink-muted">Decided {formatDateTime(d.at, timeZone)}</p>
        {claim.context.appealOpenUntil && claim.stage === 'denied' ? (
          <p className="mt-2 text-sm">
            {claim.context.appealsUsed > 0
              ? 'The appeal was reviewed; this decision is final.'
              : Date.parse(claim.context.appealOpenUntil) > Date.now()
                ? `${audience === 'dealer' ? 'You may' : 'The dealer may'} appeal once until ${formatDateTime(claim.context.appealOpenUntil, timeZone)}.`
                : `The appeal window closed ${formatDateTime(claim.context.appealOpenUntil, timeZone)}.`}
          </p>
        ) : null}
      </section>
    );
  }
  const lines = claim.approvedLines ? compareLines(claim.requestedLines, claim.approvedLines) : [];
  const partial = d.outcome === 'partial';
  return (
    <section className="card border-charge-300 p-5" data-testid="decision">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 className="text-charge-700">{partial ? 'Approved in part' : 'Approved in full'}</h2>
        {claim.rmaNumber ? (
          <p className="text-sm">
            RMA <span className="font-mono text-lg font-bold" data-testid="decision-rma">{claim.rmaNumber}</span>
          </p>
        ) : null}
      </div>
      <p className="mt-1 text-xs text-ink-muted">Decided {formatDateTime(d.at, timeZone)}</p>
      {partial ? (
        <Notice tone="warning" className="mt-3">
          {audience === 'dealer' ? 'The brand changed some of what you asked for; the credit follows the approved lines.' : 'Some lines were approved for less than requested.'}
        </Notice>
      ) : null}
      <div className="mt-3">
        <LineComparisonTable lines={lines} currency={claim.currency} />
      </div>
      {audience === 'dealer' ? (
        <p className="mt-3 text-sm text-ink-soft">
          {claim.context.replacement.fromShopStock
            ? `${nothingShipsText(claim.approvedLines?.parts ?? [], 'dealer')} Keep the failed part: it goes back to the brand as the core under this RMA number, unless the brand waives the return.`
            : 'The replacement ships under this RMA number. Keep the failed part: it goes back to the brand as the core, unless the brand waives the return.'}
        </p>
      ) : null}
    </section>
  );
}
