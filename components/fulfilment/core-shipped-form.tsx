'use client';

import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { CARRIERS, CARRIER_CODES, checkTrackingNumber, isCarrierCode } from '@/lib/carrier/carriers';
import { useStep } from './use-step';

/**
 * The dealer marks the core shipped. On the prepaid label the carrier and number are filled in;
 * a battery travels on that label only, and the dealer confirms it is packed as instructed.
 */
export function CoreShippedForm({
  claimId, version, label, battery, damaged,
}: {
  claimId: string;
  version: number;
  label: { carrier: string; trackingNumber: string } | null;
  battery: boolean;
  damaged: boolean;
}) {
  const { send, pending, error, fieldErrors } = useStep(claimId);
  const [carrier, setCarrier] = useState(label?.carrier ?? 'ferrule');
  const [number, setNumber] = useState(label?.trackingNumber ?? '');
  const [packed, setPacked] = useState(false);
  const check = number.trim() ? checkTrackingNumber(carrier, number) : null;
  const locked = battery && label !== null;

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    await send('CORE_SHIPPED', version, { carrier, trackingNumber: number, ...(battery ? { packedAsInstructed: packed } : {}) });
  }

  return (
    <form onSubmit={submit} className="space-y-3" data-testid="core-shipped-form">
      <div className="grid gap-3 sm:grid-cols-2">
        <div>
          <label htmlFor="coreCarrier" className="field-label">Carrier</label>
          <select id="coreCarrier" className="field-input" value={carrier} onChange={(e) => setCarrier(e.target.value)} disabled={locked}>
            {CARRIER_CODES.map((c) => (
              <option key={c} value={c}>{CARRIERS[c].name}</option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="coreTracking" className="field-label">Tracking number</label>
          <input id="coreTracking" className="field-input font-mono" value={number} onChange={(e) => setNumber(e.target.value)} readOnly={locked} autoComplete="off" />
          <p className={`mt-1 text-xs ${check?.ok === false ? 'text-fault-700' : 'text-ink-muted'}`}>
            {check?.ok === false ? check.message : locked ? 'The battery travels on the prepaid return label.' : isCarrierCode(carrier) ? CARRIERS[carrier].tracking.describe : ''}
          </p>
          {fieldErrors.trackingNumber ? <p className="field-error" role="alert">{fieldErrors.trackingNumber[0]}</p> : null}
        </div>
      </div>
      {battery ? (
        <label className="flex items-start gap-2 text-sm">
          <input type="checkbox" className="mt-1 h-4 w-4" checked={packed} onChange={(e) => setPacked(e.target.checked)} />
          <span>
            {damaged
              ? 'I packed the damaged battery as the packing steps say: its own non-metallic inner packaging, non-conductive cushioning, a rigid box, the DAMAGED/DEFECTIVE mark, and it goes by ground.'
              : 'I packed the battery as instructed: terminals covered, non-conductive packaging with cushioning, and the marks shown on this claim.'}
            {fieldErrors.packedAsInstructed ? <span className="field-error block" role="alert">{fieldErrors.packedAsInstructed[0]}</span> : null}
          </span>
        </label>
      ) : null}
      {error ? <Notice tone="danger">{error}</Notice> : null}
      <Button type="submit" disabled={pending || check?.ok !== true || (battery && !packed)}>
        {pending ? 'Sending…' : 'Mark the core shipped'}
      </Button>
    </form>
  );
}
