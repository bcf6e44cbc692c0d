'use client';

import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { CARRIERS, checkTrackingNumber, isCarrierCode } from '@/lib/carrier/carriers';
import { formatDay } from '@/lib/format/dates';
import { ServicePicker, type OfferOption } from './service-picker';
import { useStep } from './use-step';

export type PickLine = { lineId: string; partNumber: string; name: string; quantity: number; onHand: number; inStock: boolean; expectedOn: string | null };

/** Pick every line, choose carrier and service, book the label or enter a tracking number, ship. */
export function ShipForm({ claimId, version, lines, offers }: { claimId: string; version: number; lines: PickLine[]; offers: OfferOption[] }) {
  const { send, pending, error, fieldErrors } = useStep(claimId);
  const [picked, setPicked] = useState<string[]>([]);
  const first = offers.find((o) => o.offered);
  const [choice, setChoice] = useState(first ? `${first.carrier}/${first.service}` : '');
  const [mode, setMode] = useState<'book' | 'manual'>('book');
  const [number, setNumber] = useState('');
  const [carrier, service] = choice.split('/') as [string, string];
  const format = isCarrierCode(carrier) ? CARRIERS[carrier].tracking : null;
  const check = mode === 'manual' && number.trim() ? checkTrackingNumber(carrier, number) : null;
  const short = lines.filter((l) => !l.inStock);
  const allPicked = lines.length > 0 && lines.every((l) => picked.includes(l.lineId));

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    await send('SHIP', version, { carrier, service, tracking: mode, trackingNumber: mode === 'manual' ? number : undefined, pickedLineIds: picked });
  }

  return (
    <form onSubmit={submit} className="space-y-5" data-testid="ship-form">
      <fieldset>
        <legend className="field-label">Pick the lines</legend>
        <ul className="divide-y divide-paper-line rounded-md border border-paper-line">
          {lines.map((l) => (
            <li key={l.lineId} className="px-3 py-2">
              <label className={`flex items-start gap-3 text-sm ${l.inStock ? 'cursor-pointer' : 'text-ink-muted'}`}>
                <input
                  type="checkbox"
                  className="mt-1 h-4 w-4"
                  disabled={!l.inStock}
                  checked={picked.includes(l.lineId)}
                  onChange={(e) => setPicked((p) => (e.target.checked ? [...p, l.lineId] : p.filter((x) => x !== l.lineId)))}
                  aria-label={`Picked ${l.quantity} × ${l.partNumber}`}
                />
                <span>
                  <span className="font-mono font-bold">{l.quantity} × {l.partNumber}</span> {l.name}
                  <span className={`block text-xs ${l.inStock ? 'text-ink-muted' : 'font-bold text-volt-700'}`}>
                    {l.inStock ? `${l.onHand} on hand` : `Back-ordered: ${l.onHand} on hand${l.expectedOn ? `, more expected ${formatDay(l.expectedOn)}` : ', no date yet'}`}
                  </span>
                </span>
              </label>
            </li>
          ))}
        </ul>
        {fieldErrors.pickedLineIds ? <p className="field-error" role="alert">{fieldErrors.pickedLineIds[0]}</p> : null}
      </fieldset>

      {short.length ? (
        <Notice tone="warning" title="Not enough stock to ship">
          Set the date more is expected on the Stock page; the dealer sees it on the claim. Ship once the parts are in.
        </Notice>
      ) : null}

      <ServicePicker name="service" offers={offers} value={choice} onChange={setChoice} error={fieldErrors.service?.[0] ?? fieldErrors.carrier?.[0]} />

      <fieldset className="space-y-2">
        <legend className="field-label">Tracking number</legend>
        <label className="flex items-center gap-2 text-sm">
          <input type="radio" name="tracking" checked={mode === 'book'} onChange={() => setMode('book')} /> Book the label with the carrier (it sends the tracking number)
        </label>
        <label className="flex items-center gap-2 text-sm">
          <input type="radio" name="tracking" checked={mode === 'manual'} onChange={() => setMode('manual')} /> The parcel has a label already: enter its tracking number
        </label>
        {mode === 'manual' ? (
          <div>
            <label htmlFor="trackingNumber" className="sr-only">Tracking number from the label</label>
            <input
              id="trackingNumber"
              className="field-input font-mono"
              value={number}
              onChange={(e) => setNumber(e.target.value)}
              placeholder={format?.example}
              autoComplete="off"
              aria-invalid={check?.ok === false}
            />
            <p className={`mt-1 text-xs ${check?.ok === false ? 'text-fault-700' : 'text-ink-muted'}`}>{check?.ok === false ? check.message : format?.describe}</p>
            {fieldErrors.trackingNumber ? <p className="field-error" role="alert">{fieldErrors.trackingNumber[0]}</p> : null}
          </div>
        ) : null}
      </fieldset>

      {error ? <Notice tone="danger">{error}</Notice> : null}
      <Button type="submit" disabled={pending || !choice || !allPicked || (mode === 'manual' && check?.ok !== true)}>
        {pending ? 'Booking with the carrier…' : 'Ship the replacement'}
      </Button>
      {!allPicked ? <p className="text-xs text-ink-muted">Tick every line as picked to ship.</p> : null}
    </form>
  );
}
