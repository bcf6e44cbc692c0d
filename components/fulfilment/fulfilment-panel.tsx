import Link from 'next/link';
import { EvidenceDropzone } from '@/components/evidence/evidence-dropzone';
import { Notice } from '@/components/ui/notice';
import { carrierName, findService, TRACKING_LABELS } from '@/lib/carrier/carriers';
import type { Attachment } from '@/lib/db/attachments';
import type { ClaimRecord } from '@/lib/db/claims';
import type { AppUser } from '@/lib/db/users';
import { formatDateTime, formatDay } from '@/lib/format/dates';
import { loadFulfilmentView, type ParcelView } from '@/lib/services/fulfilment-view';
import { CORE_CONDITION_LABELS, INSPECTION_RESULT_LABELS, WAIVER_REASON_LABELS } from '@/machines/claim';
import { CoreShippedForm } from './core-shipped-form';
import { DangerousGoodsPanel } from './dangerous-goods-panel';
import { TrackSteps } from './track-steps';
import { WaiveCoreForm } from './waive-core-form';
import { nothingShipsText } from '@/lib/fulfilment';

function ParcelLine({ parcel, timeZone }: { parcel: ParcelView; timeZone: string }) {
  const latest = parcel.events.at(-1);
  return (
    <div className="rounded-md border border-paper-line bg-paper px-3 py-2 text-sm" data-testid={`parcel-${parcel.direction}`}>
      <p>
        <span className="font-bold">{carrierName(parcel.carrier)}</span>
        {findService(parcel.carrier, parcel.service) ? ` · ${findService(parcel.carrier, parcel.service)!.name}` : ''} · tracking{' '}
        <span className="font-mono">{parcel.trackingNumber}</span>
      </p>
      <p className="text-ink-soft" data-testid={`tracking-status-${parcel.direction}`}>
        {TRACKING_LABELS[parcel.trackingStatus]}
        {latest ? ` · ${[latest.location, formatDateTime(latest.occurredAt, timeZone)].filter(Boolean).join(' · ')}` : ''}
      </p>
      {parcel.events.length > 1 ? (
        <details className="mt-1 text-xs text-ink-muted">
          <summary className="cursor-pointer">All tracking events ({parcel.events.length})</summary>
          <ol className="mt-1 space-y-0.5">
            {parcel.events.map((e) => (
              <li key={e.id}>
                {[formatDateTime(e.occurredAt, timeZone), e.description, e.location].filter(Boolean).join(' · ')}
              </li>
            ))}
          </ol>
        </details>
      ) : null}
    </div>
  );
}

/**
 * The two tracks after approval, side by side: where the replacement is and where the core is,
 * with dates, and what each party can do next (the dealer ships the core; a rep may waive it).
 */
export async function FulfilmentPanel({ claim, user, attachments }: { claim: ClaimRecord; user: AppUser; attachments: Attachment[] }) {
  const view = await loadFulfilmentView(claim);
  if (!view) return null;
  const isDealer = user.orgKind === 'dealer';
  const tz = user.timeZone;
  const ret = view.returnParcel;
  const damaged = ret?.batteryCondition === 'damaged_or_defective';
  const proofs = attachments.filter((a) => a.kind === 'core_disposal_proof').map((a) => ({ id: a.id, fileName: a.fileName }));
  const short = view.availability.filter((a) => !a.inStock);
  const core = claim.context.core;

  return (
    <section className="card p-5" data-testid="fulfilment">
      <div className="mb-4 flex flex-wrap items-baseline justify-between gap-2">
        <h2>Replacement and core</h2>
        {user.role === 'warehouse' ? (
          <Link href={`/warehouse/claims/${claim.id}`} className="text-sm font-bold text-charge-700 hover:underline">
            Work on it in Shipping & cores →
          </Link>
        ) : null}
      </div>
      <div className="grid gap-6 md:grid-cols-2">
        <div className="space-y-3">
          <h3 className="text-sm font-bold uppercase tracking-wide text-ink-muted">The replacement</h3>
          <TrackSteps steps={view.replacementSteps} timeZone={tz} testId="replacement-track" />
          {short.length ? (
            <Notice tone="warning" title="Back-ordered">
              {short.map((a) => (
                <span key={a.lineId} className="block">
                  {a.quantity} × <span className="font-mono">{a.partNumber}</span>: {a.expectedOn ? `expected in the warehouse on ${formatDay(a.expectedOn)}` : 'the warehouse will set the expected date'}
                </span>
              ))}
            </Notice>
          ) : null}
          {view.outbound ? <ParcelLine parcel={view.outbound} timeZone={tz} /> : null}
          {view.outbound ? (
            <a href={`/api/claims/${claim.id}/packing-slip`} target="_blank" rel="noreferrer" className="inline-block text-sm font-bold text-charge-700 underline">
              Packing slip (PDF)
            </a>
          ) : null}
          {view.outbound?.dangerousGoods?.length ? (
            <details className="text-sm">
              <summary className="cursor-pointer font-bold text-volt-700">A lithium battery is in this parcel: handling</summary>
              <div className="mt-2">
                <DangerousGoodsPanel batteries={view.outbound.dangerousGoods} />
              </div>
            </details>
          ) : null}
          {isDealer && view.replacementStep === 'shipped' && view.outbound?.trackingStatus === 'delivered' ? (
            <Notice tone="info" title="Delivered: fit it, then prove it">
              Fit the replacement, then upload the load test after the repair. The after-test shows the fix restored performance and releases the labor credit.
            </Notice>
          ) : null}
          {isDealer && view.replacementStep === 'from_shop_stock' ? (
            <Notice tone="info" title="Nothing ships: prove the repair">
              {nothingShipsText(claim.approvedLines?.parts ?? [], 'dealer')} Upload the load test after the repair below; it shows the fix restored performance and releases the labor credit.
            </Notice>
          ) : null}
          {view.dealerStockLines.length ? (
            <p className="text-xs text-ink-muted">
              From your own stock (credited, not shipped): {view.dealerStockLines.map((l) => `${l.quantity} × ${l.partNumber}`).join(', ')}
            </p>
          ) : null}
        </div>

        <div className="space-y-3" id="core">
          <h3 className="text-sm font-bold uppercase tracking-wide text-ink-muted">The failed part (core){view.corePartLabel ? `: ${view.corePartLabel}` : ''}</h3>
          <TrackSteps steps={view.coreSteps} timeZone={tz} testId="core-track" />

          {view.coreStep === 'requested' && !ret && isDealer ? (
            <Notice tone="info" title="Keep the failed part">
              {claim.brandName} sends a prepaid return label for it; you will find it here and by e-mail.
              {view.coreIsBattery ? ' Until then store the battery isolated: on a non-combustible surface, away from anything that burns, terminals covered.' : ''}
            </Notice>
          ) : null}
          {view.coreStep === 'requested' && !ret && !isDealer ? <p className="text-sm text-ink-muted">No return label issued yet.</p> : null}

          {view.coreStep === 'requested' && ret ? (
            <div className="space-y-3" data-testid="return-instructions">
              <p className="text-sm">
                Send it back under RMA <span className="font-mono font-bold">{claim.rmaNumber}</span> with the prepaid {carrierName(ret.carrier)} label
                {findService(ret.carrier, ret.service) ? ` (${findService(ret.carrier, ret.service)!.name})` : ''}: print it, put a copy of the packing slip in the box,
                hand the parcel in, then mark the core shipped below.
              </p>
              {ret.labelKey ? (
                <a href={`/api/shipments/${ret.id}/label`} target="_blank" rel="noreferrer" className="inline-block text-sm font-bold text-charge-700 underline" data-testid="return-label-link">
                  Print the return label (PDF)
                </a>
              ) : null}
              {view.coreClock ? (
                <p className={`text-sm ${view.coreClock.status === 'reminder_due' || view.coreClock.status === 'chargeback_due' ? 'font-bold text-fault-700' : 'text-ink-soft'}`} data-testid="core-clock">
                  {view.coreClock.summary}
                </p>
              ) : (
                <p className="text-sm text-ink-muted">The return period starts when the replacement is delivered.</p>
              )}
              {ret.dangerousGoods?.length ? (
                <DangerousGoodsPanel batteries={ret.dangerousGoods} title={damaged ? 'Damaged lithium battery: pack it as below, ground only' : 'Lithium battery: dangerous goods'} />
              ) : null}
              {isDealer ? (
                <CoreShippedForm
                  claimId={claim.id}
                  version={claim.version}
                  label={{ carrier: ret.carrier, trackingNumber: ret.trackingNumber }}
                  battery={view.coreIsBattery}
                  damaged={damaged}
                />
              ) : null}
            </div>
          ) : null}

          {view.coreStep === 'in_transit' && ret ? <ParcelLine parcel={ret} timeZone={tz} /> : null}
          {(view.coreStep === 'received' || view.coreStep === 'inspected') && core.condition ? (
            <p className="text-sm">
              Arrived: <span className="font-bold">{CORE_CONDITION_LABELS[core.condition]}</span>
              {core.conditionNotes ? ` · “${core.conditionNotes}”` : ''}
            </p>
          ) : null}
          {core.inspection ? (
            <Notice tone={core.inspection.result === 'fault_confirmed' ? 'success' : 'warning'} title={`Inspection: ${INSPECTION_RESULT_LABELS[core.inspection.result]}`}>
              {core.inspection.notes ? <span className="block">{core.inspection.notes}</span> : null}
              {core.inspection.result !== 'fault_confirmed' ? <span className="block">This leads to a chargeback on the claim’s credit.</span> : null}
            </Notice>
          ) : null}
          {core.waiver ? <Notice tone="success" title="The core stays with the shop">{WAIVER_REASON_LABELS[core.waiver.reason]}.</Notice> : null}
          {view.coreStep === 'written_off' ? <Notice tone="danger" title="Core written off">Not returned by the end of grace: flagged for a chargeback on the claim’s credit.</Notice> : null}

          {view.coreStep === 'requested' && (isDealer || user.role === 'brand_rep') ? (
            <details className="rounded-md border border-paper-line p-3 text-sm" open={user.role === 'brand_rep' && proofs.length > 0}>
              <summary className="cursor-pointer font-bold">{isDealer ? 'Recycled it locally instead? Add the proof' : 'Waive the return (local recycling or scrapping)'}</summary>
              <div className="mt-3 space-y-3">
                <EvidenceDropzone claimId={claim.id} kind="core_disposal_proof" hint="A photo of the recycler’s receipt or the scrapped part with its serial." />
                {user.role === 'brand_rep' ? <WaiveCoreForm claimId={claim.id} version={claim.version} proofs={proofs} /> : <p className="text-xs text-ink-muted">The brand’s rep decides whether the return is waived.</p>}
              </div>
            </details>
          ) : null}
        </div>
      </div>
    </section>
  );
}
