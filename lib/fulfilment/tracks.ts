import { carrierName, dealerTrackingWord, type TrackingStatus } from '@/lib/carrier/carriers';
import { formatDay } from '@/lib/format/dates';
import type { ClaimContext, CoreState, ReplacementState } from '@/machines/claim';
import { CORE_CONDITION_LABELS, INSPECTION_RESULT_LABELS, WAIVER_REASON_LABELS } from '@/machines/claim';

export type StepState = 'done' | 'current' | 'todo';

export interface TrackStep {
  key: string;
  label: string;
  state: StepState;
  /** ISO instant of the moment the step happened (done) or a due date (todo). */
  at: string | null;
  detail: string | null;
}

export interface ParcelSummary {
  carrier: string;
  trackingNumber: string;
  trackingStatus: TrackingStatus;
  handedOverAt: string | null;
  deliveredAt: string | null;
  createdAt: string;
}

function mark(steps: Omit<TrackStep, 'state'>[], currentIndex: number): TrackStep[] {
  return steps.map((s, i) => ({ ...s, state: i < currentIndex ? 'done' : i === currentIndex ? 'current' : 'todo' }));
}

/**
 * The replacement's way to the dealer, as the dealer follows it: to ship → shipped → in transit →
 * delivered → fitted → verified. The carrier's own word (in transit, delivered) comes from tracking.
 */
export function replacementTrack(
  step: ReplacementState,
  ctx: ClaimContext,
  parcel: ParcelSummary | null,
  backordered: string | null,
  /** With nothing to ship: whether an approved part came from the shop's own stock (else none was approved). */
  fromShopShelf = true,
): TrackStep[] {
  if (ctx.replacement.fromShopStock) {
    // Nothing travels: the dealer fitted its own part, and proves the repair with the after-test.
    const own: Omit<TrackStep, 'state'>[] = [
      { key: 'from_shop_stock', label: fromShopShelf ? 'From the shop’s own stock: nothing ships' : 'No replacement part approved: nothing ships', at: ctx.decision?.at ?? null, detail: null },
      { key: 'fitted', label: 'After-test uploaded', at: ctx.replacement.fittedAt, detail: null },
      { key: 'verified', label: 'Verified by the after-test', at: ctx.afterTest.settledAt, detail: ctx.afterTest.outcome === 'accepted_by_hand' ? 'Accepted by the rep by hand' : null },
    ];
    return mark(own, step === 'from_shop_stock' ? 1 : step === 'fitted' ? 2 : 3);
  }
  const word = parcel ? dealerTrackingWord(parcel.trackingStatus) : null;
  const via = parcel ? `${carrierName(parcel.carrier)} ${parcel.trackingNumber}` : ctx.replacement.carrier ? `${carrierName(ctx.replacement.carrier)} ${ctx.replacement.trackingNumber ?? ''}`.trim() : null;
  const steps: Omit<TrackStep, 'state'>[] = [
    { key: 'to_ship', label: 'Being picked at the brand’s warehouse', at: ctx.decision?.at ?? null, detail: backordered },
    { key: 'shipped', label: 'Shipped', at: ctx.replacement.shippedAt, detail: via },
    { key: 'in_transit', label: word === 'held up' ? 'Held up at the carrier' : 'In transit', at: null, detail: null },
    { key: 'delivered', label: 'Delivered', at: parcel?.deliveredAt ?? null, detail: null },
    { key: 'fitted', label: 'Fitted, after-test uploaded', at: ctx.replacement.fittedAt, detail: null },
    { key: 'verified', label: 'Verified by the after-test', at: ctx.afterTest.settledAt, detail: ctx.afterTest.outcome === 'accepted_by_hand' ? 'Accepted by the rep by hand' : null },
  ];
  let current: number;
  if (step === 'to_ship') current = 0;
  else if (step === 'shipped') current = word === 'delivered' ? 3 : word === 'in transit' || word === 'held up' ? 2 : 1;
  else if (step === 'fitted') current = 4;
  else current = 6;
  return mark(steps, current);
}

/**
 * The core's way back: return label → shipped back → received → inspected; or the return is waived
 * or written off, which ends the track.
 */
export function coreTrack(step: CoreState, ctx: ClaimContext, parcel: ParcelSummary | null, dueOn: string | null): TrackStep[] {
  const core = ctx.core;
  if (step === 'waived' && core.waiver) {
    return [{ key: 'waived', label: 'Return waived', state: 'done', at: core.waiver.at, detail: WAIVER_REASON_LABELS[core.waiver.reason] }];
  }
  if (step === 'written_off') {
    return [
      { key: 'requested', label: 'Core requested', state: 'done', at: ctx.decision?.at ?? null, detail: core.remindersSent ? `${core.remindersSent} reminder${core.remindersSent === 1 ? '' : 's'} sent` : null },
      { key: 'written_off', label: 'Written off: not returned in time (chargeback)', state: 'done', at: core.writtenOffAt, detail: null },
    ];
  }
  const label = core.labelRef ? 'Return label ready' : 'Waiting for the return label';
  const steps: Omit<TrackStep, 'state'>[] = [
    { key: 'requested', label, at: parcel?.createdAt ?? null, detail: dueOn ? `Send it back by ${formatDay(dueOn)}` : core.labelRef ? 'The return clock starts when the replacement is delivered' : null },
    { key: 'in_transit', label: 'On its way back', at: core.shippedAt, detail: core.carrier ? `${carrierName(core.carrier)} ${core.trackingNumber ?? ''}`.trim() : null },
    { key: 'received', label: 'Received at the warehouse', at: core.receivedAt, detail: core.condition ? CORE_CONDITION_LABELS[core.condition] : null },
    { key: 'inspected', label: 'Inspected', at: core.inspection?.at ?? null, detail: core.inspection ? INSPECTION_RESULT_LABELS[core.inspection.result] : null },
  ];
  const current = step === 'requested' ? 0 : step === 'in_transit' ? 1 : step === 'received' ? 2 : 4;
  return mark(steps, current);
}
