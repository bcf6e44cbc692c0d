import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { z } from 'zod';
import { StageBadge } from '@/components/claims/stage-badge';
import { Timeline } from '@/components/claims/timeline';
import { EvidenceDropzone } from '@/components/evidence/evidence-dropzone';
import { EvidenceGallery } from '@/components/evidence/evidence-gallery';
import { DangerousGoodsPanel } from '@/components/fulfilment/dangerous-goods-panel';
import { FulfilmentPanel } from '@/components/fulfilment/fulfilment-panel';
import { InspectForm } from '@/components/fulfilment/inspect-form';
import { ReceiveForm } from '@/components/fulfilment/receive-form';
import { ReturnLabelForm } from '@/components/fulfilment/return-label-form';
import type { OfferOption } from '@/components/fulfilment/service-picker';
import { ShipForm } from '@/components/fulfilment/ship-form';
import { Notice } from '@/components/ui/notice';
import { requireRole } from '@/lib/auth/session';
import { listAttachments } from '@/lib/db/attachments';
import { findClaimForUser, listEvents } from '@/lib/db/claims';
import { organisationAddress } from '@/lib/db/fulfilment';
import { nothingShipsText, type ServiceOffer } from '@/lib/fulfilment';
import { loadFulfilmentView, type FulfilmentView } from '@/lib/services/fulfilment-view';
import { describeState } from '@/machines/claim';

export const metadata: Metadata = { title: 'Ship and receive' };

const options = (offers: ServiceOffer[]): OfferOption[] =>
  offers.map((o) => ({ carrier: o.carrier, carrierName: o.carrierName, service: o.service.code, serviceName: o.service.name, days: o.service.days, offered: o.offered, reason: o.reason }));

/** One claim as the warehouse works it: pick and ship, issue the return label, receive and inspect the core. */
export default async function WarehouseClaimPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requireRole('warehouse');
  const { id } = await params;
  if (!z.uuid().safeParse(id).success) notFound();
  const claim = await findClaimForUser(user, id);
  if (!claim) notFound();
  const [view, attachments, events, dealer] = await Promise.all([loadFulfilmentView(claim), listAttachments(claim.id), listEvents(claim.id), organisationAddress(claim.dealerId)]);
  const state = describeState(claim.stateValue);
  const inspectionPhotos = attachments.filter((a) => a.kind === 'inspection_photo');
  const ret = view?.returnParcel ?? null;

  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-start justify-between gap-4">
        <div>
          <p className="text-sm text-ink-muted">
            <Link href="/warehouse" className="underline">Shipping & cores</Link> · claim{' '}
            <Link href={`/claims/${claim.id}`} className="font-mono underline">{claim.number}</Link>
          </p>
          <h1 className="flex flex-wrap items-center gap-3">
            <span className="font-mono" data-testid="rma-number">{claim.rmaNumber ?? 'No RMA yet'}</span>
            <StageBadge stage={state.stage} label={state.label} />
          </h1>
          <p className="mt-1 text-ink-soft">
            {claim.dealerName} · account {claim.accountNumber}
            {dealer ? ` · ${dealer.line}, ${dealer.postcode} ${dealer.city}, ${dealer.country}` : ''}
          </p>
        </div>
        {claim.rmaNumber && !claim.context.replacement.fromShopStock ? (
          <a href={`/api/claims/${claim.id}/packing-slip`} target="_blank" rel="noreferrer" className="inline-flex min-h-10 items-center rounded-md border border-paper-line bg-paper-raised px-4 py-2 text-sm font-bold hover:bg-paper-sunk" data-testid="packing-slip-link">
            {view?.outbound ? 'Packing slip (PDF)' : 'Pick list (PDF)'}
          </a>
        ) : null}
      </div>

      {!view ? (
        <Notice tone="info" title="Nothing to do here yet">This claim is not approved, so there is nothing to ship or receive.</Notice>
      ) : (
        <div className="grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
          <div className="space-y-6">
            {view.replacementStep === 'to_ship' ? (
              <section className="card space-y-4 p-5" data-testid="ship-section">
                <h2>Pick and ship the replacement</h2>
                {view.outboundBatteries.length ? <DangerousGoodsPanel batteries={view.outboundBatteries} /> : null}
                <ShipForm
                  claimId={claim.id}
                  version={claim.version}
                  lines={view.availability.map((a) => ({ lineId: a.lineId, partNumber: a.partNumber, name: claim.approvedLines?.parts.find((p) => p.lineId === a.lineId)?.name ?? a.partNumber, quantity: a.quantity, onHand: a.onHand, inStock: a.inStock, expectedOn: a.expectedOn }))}
                  offers={options(view.outboundOffers)}
                />
              </section>
            ) : null}
            {view.replacementStep === 'from_shop_stock' ? (
              <Notice tone="info" title="Nothing to ship">
                {nothingShipsText(claim.approvedLines?.parts ?? [], 'brand')} Only the core comes back.
              </Notice>
            ) : null}

            {view.coreStep === 'requested' ? (
              <section className="card space-y-4 p-5" data-testid="label-section">
                <h2>{ret ? 'Core return label' : 'Issue the core return label'}</h2>
                {ret ? (
                  <p className="text-sm">
                    Issued: <span className="font-mono">{ret.trackingNumber}</span>. Waiting for {claim.dealerName} to send the core.{' '}
                    {ret.labelKey ? <a className="font-bold text-charge-700 underline" href={`/api/shipments/${ret.id}/label`} target="_blank" rel="noreferrer">Label (PDF)</a> : null}
                  </p>
                ) : (
                  <p className="text-sm text-ink-soft">The dealer gets the label and the return instructions by e-mail and on the claim.</p>
                )}
                {ret ? (
                  <details>
                    <summary className="cursor-pointer text-sm font-bold">Issue a new label instead</summary>
                    <div className="mt-3">
                      <ReturnLabelForm claimId={claim.id} version={claim.version} reissue offers={options(view.plainOffers)} battery={batteryOptions(view)} />
                    </div>
                  </details>
                ) : (
                  <ReturnLabelForm claimId={claim.id} version={claim.version} reissue={false} offers={options(view.plainOffers)} battery={batteryOptions(view)} />
                )}
              </section>
            ) : null}

            {view.coreStep === 'requested' || view.coreStep === 'in_transit' ? (
              <section className="card p-5" data-testid="receive-section">
                {/* Before the dealer marks it shipped the core may still turn up at the dock: receiving stays possible, folded away. */}
                <details open={view.coreStep === 'in_transit' || ret?.deliveredAt != null} className="space-y-4">
                  <summary className="cursor-pointer text-lg font-bold">Receive the core{view.coreStep === 'requested' ? ' (arrived before it was marked shipped?)' : ''}</summary>
                  <div className="mt-4 space-y-4">
                    {ret?.batteryCondition === 'damaged_or_defective' ? (
                      <Notice tone="danger" title="Declared damaged or defective">Unpack it only in the battery area, on a non-combustible surface, with the fire-safe container at hand.</Notice>
                    ) : null}
                    <ReceiveForm claimId={claim.id} version={claim.version} battery={view.coreIsBattery} />
                  </div>
                </details>
              </section>
            ) : null}

            {view.coreStep === 'received' ? (
              <section className="card space-y-4 p-5" data-testid="inspect-section">
                <h2>Inspect the core</h2>
                <EvidenceDropzone claimId={claim.id} kind="inspection_photo" hint="The part on the bench, the fault (or its absence), any damage." />
                <EvidenceGallery claimId={claim.id} attachments={inspectionPhotos} removable={false} />
                <InspectForm claimId={claim.id} version={claim.version} photoCount={inspectionPhotos.length} />
              </section>
            ) : null}

            <FulfilmentPanel claim={claim} user={user} attachments={attachments} />
          </div>
          <div className="space-y-6">
            <section className="card p-5">
              <h2 className="mb-3">The claim</h2>
              <dl className="grid gap-2 text-sm">
                <div><dt className="text-xs font-bold uppercase tracking-wide text-ink-muted">Failed part</dt><dd><span className="font-mono">{claim.partNumber}</span> {claim.partName} · serial <span className="font-mono">{claim.partSerial || '—'}</span></dd></div>
                <div><dt className="text-xs font-bold uppercase tracking-wide text-ink-muted">What the rider noticed</dt><dd>{claim.symptom || '—'}</dd></div>
                <div><dt className="text-xs font-bold uppercase tracking-wide text-ink-muted">Dealer’s diagnosis</dt><dd className="whitespace-pre-wrap">{claim.description || '—'}</dd></div>
              </dl>
            </section>
            <section className="card p-5">
              <h2 className="mb-4">Timeline</h2>
              <Timeline events={events} timeZone={user.timeZone} />
            </section>
          </div>
        </div>
      )}
    </div>
  );
}

function batteryOptions(view: FulfilmentView) {
  if (!view.returnOffers || !view.returnClasses) return null;
  return {
    sound: { offers: options(view.returnOffers.sound), cls: view.returnClasses.sound },
    damaged: { offers: options(view.returnOffers.damaged), cls: view.returnClasses.damaged },
  };
}
