'use client';

import clsx from 'clsx';

export type OfferOption = {
  carrier: string;
  carrierName: string;
  service: string;
  serviceName: string;
  days: string;
  offered: boolean;
  reason: string | null;
};

/** Carrier and service as one choice; services the rules or the carrier refuse are shown, greyed, with why. */
export function ServicePicker({ name, offers, value, onChange, error }: { name: string; offers: OfferOption[]; value: string; onChange: (v: string) => void; error?: string }) {
  return (
    <fieldset>
      <legend className="field-label">Carrier and service</legend>
      <div className="grid gap-2 sm:grid-cols-2">
        {offers.map((o) => {
          const v = `${o.carrier}/${o.service}`;
          return (
            <label
              key={v}
              className={clsx(
                'flex gap-2 rounded-md border px-3 py-2 text-sm',
                !o.offered ? 'cursor-not-allowed border-paper-line bg-paper-sunk text-ink-muted' : value === v ? 'border-charge-500 bg-charge-50' : 'cursor-pointer border-paper-line bg-paper-raised hover:border-charge-300',
              )}
            >
              <input type="radio" name={name} value={v} checked={value === v} disabled={!o.offered} onChange={() => onChange(v)} className="mt-1" />
              <span>
                <span className="font-bold">{o.carrierName}</span> · {o.serviceName}
                <span className="block text-xs text-ink-muted">{o.offered ? o.days : o.reason}</span>
              </span>
            </label>
          );
        })}
      </div>
      {error ? <p className="field-error" role="alert">{error}</p> : null}
    </fieldset>
  );
}
