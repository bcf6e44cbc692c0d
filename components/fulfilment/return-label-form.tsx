'use client';

import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import type { StoredBatteryClass } from '@/lib/fulfilment/dangerous-goods';
import { DangerousGoodsPanel } from './dangerous-goods-panel';
import { ServicePicker, type OfferOption } from './service-picker';
import { useStep } from './use-step';

type Condition = 'sound' | 'damaged_or_defective';

const CONDITION_TEXT: Record<Condition, { title: string; hint: string }> = {
  sound: { title: 'Sound', hint: 'No cracks, swelling, water or overheating; it only failed its test.' },
  damaged_or_defective: { title: 'Damaged or defective', hint: 'Cracked, swollen, wet, hot, or with a safety fault. When unsure, choose this.' },
};

/**
 * The prepaid return label for the core. A battery core is classified for its condition first:
 * a damaged one is offered ground only, and the label waits for the packaging confirmation.
 */
export function ReturnLabelForm({
  claimId, version, battery, offers, reissue,
}: {
  claimId: string;
  version: number;
  battery: { sound: { offers: OfferOption[]; cls: StoredBatteryClass }; damaged: { offers: OfferOption[]; cls: StoredBatteryClass } } | null;
  offers: OfferOption[];
  reissue: boolean;
}) {
  const { send, pending, error, fieldErrors } = useStep(claimId);
  const [condition, setCondition] = useState<Condition | null>(null);
  const [confirmed, setConfirmed] = useState(false);
  const current = battery && condition ? (condition === 'sound' ? battery.sound : battery.damaged) : null;
  const options = battery ? (current?.offers ?? []) : offers;
  const firstGround = options.find((o) => o.offered);
  const [choice, setChoice] = useState(firstGround ? `${firstGround.carrier}/${firstGround.service}` : '');
  const chosenOffered = options.some((o) => `${o.carrier}/${o.service}` === choice && o.offered);

  function pickCondition(c: Condition) {
    setCondition(c);
    setConfirmed(false);
    const list = battery ? (c === 'sound' ? battery.sound.offers : battery.damaged.offers) : offers;
    if (!list.some((o) => `${o.carrier}/${o.service}` === choice && o.offered)) {
      const f = list.find((o) => o.offered);
      setChoice(f ? `${f.carrier}/${f.service}` : '');
    }
  }

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    const [carrier, service] = choice.split('/');
    await send('ISSUE_RETURN_LABEL', version, {
      carrier, service,
      ...(battery ? { batteryCondition: condition ?? undefined, packagingConfirmed: condition === 'damaged_or_defective' ? confirmed : undefined } : {}),
    });
  }

  return (
    <form onSubmit={submit} className="space-y-4" data-testid="return-label-form">
      {battery ? (
        <fieldset>
          <legend className="field-label">The battery core’s condition for transport</legend>
          <div className="grid gap-2 sm:grid-cols-2">
            {(['sound', 'damaged_or_defective'] as const).map((c) => (
              <label key={c} className={`flex cursor-pointer gap-2 rounded-md border px-3 py-2 text-sm ${condition === c ? 'border-charge-500 bg-charge-50' : 'border-paper-line bg-paper-raised'}`}>
                <input type="radio" name="batteryCondition" checked={condition === c} onChange={() => pickCondition(c)} className="mt-1" />
                <span>
                  <span className="font-bold">{CONDITION_TEXT[c].title}</span>
                  <span className="block text-xs text-ink-muted">{CONDITION_TEXT[c].hint}</span>
                </span>
              </label>
            ))}
          </div>
          {fieldErrors.batteryCondition ? <p className="field-error" role="alert">{fieldErrors.batteryCondition[0]}</p> : null}
        </fieldset>
      ) : null}

      {current ? <DangerousGoodsPanel batteries={[current.cls]} title={condition === 'damaged_or_defective' ? 'Damaged lithium battery: dangerous goods, ground only' : 'Lithium battery: dangerous goods'} /> : null}

      {battery && condition === 'damaged_or_defective' ? (
        <label className="flex items-start gap-2 rounded-md border border-fault-500/40 bg-fault-50 px-3 py-2 text-sm">
          <input type="checkbox" className="mt-1 h-4 w-4" checked={confirmed} onChange={(e) => setConfirmed(e.target.checked)} />
          <span>
            <span className="font-bold">Special packaging confirmed.</span> The dealer has the packing steps above and the battery will travel packed exactly so, marked
            “DAMAGED/DEFECTIVE LITHIUM ION BATTERIES”, by ground only.
            {fieldErrors.packagingConfirmed ? <span className="field-error block" role="alert">{fieldErrors.packagingConfirmed[0]}</span> : null}
          </span>
        </label>
      ) : null}

      {!battery || condition ? <ServicePicker name="return-service" offers={options} value={choice} onChange={setChoice} error={fieldErrors.service?.[0]} /> : null}

      {error ? <Notice tone="danger">{error}</Notice> : null}
      <Button type="submit" disabled={pending || !chosenOffered || (battery !== null && condition === null) || (condition === 'damaged_or_defective' && !confirmed)}>
        {pending ? 'Booking the label…' : reissue ? 'Issue a new return label (the old one is cancelled)' : 'Issue the return label'}
      </Button>
    </form>
  );
}
