'use client';

import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { useStep } from './use-step';

const CONDITIONS = [
  { value: 'sound', label: 'Arrived as described', hint: 'Packaging intact, the part as the claim says.' },
  { value: 'transit_damage', label: 'Damaged in transit', hint: 'Crushed box, broken housing: note what you see.' },
  { value: 'incomplete', label: 'Parts missing', hint: 'Something the claim lists is not in the box.' },
] as const;

/** Records the core's arrival and its condition on the dock. */
export function ReceiveForm({ claimId, version, battery }: { claimId: string; version: number; battery: boolean }) {
  const { send, pending, error, fieldErrors } = useStep(claimId);
  const [condition, setCondition] = useState<string>('');
  const [notes, setNotes] = useState('');

  return (
    <form
      onSubmit={(e) => {
        e.preventDefault();
        void send('CORE_RECEIVED', version, { condition, notes: notes || undefined });
      }}
      className="space-y-3"
      data-testid="receive-form"
      id="receive"
    >
      {battery ? (
        <Notice tone="warning" title="Battery core: open it in the battery area">
          If the parcel is hot, swollen, smoking or smells of solvent, do not open it: move it to the fire-safe store outdoors and follow your site’s
          lithium-battery procedure.
        </Notice>
      ) : null}
      <fieldset>
        <legend className="field-label">Condition on arrival</legend>
        <div className="grid gap-2 sm:grid-cols-3">
          {CONDITIONS.map((c) => (
            <label key={c.value} className={`flex cursor-pointer gap-2 rounded-md border px-3 py-2 text-sm ${condition === c.value ? 'border-charge-500 bg-charge-50' : 'border-paper-line bg-paper-raised'}`}>
              <input type="radio" name="condition" value={c.value} checked={condition === c.value} onChange={() => setCondition(c.value)} className="mt-1" />
              <span>
                <span className="font-bold">{c.label}</span>
                <span className="block text-xs text-ink-muted">{c.hint}</span>
              </span>
            </label>
          ))}
        </div>
        {fieldErrors.condition ? <p className="field-error" role="alert">{fieldErrors.condition[0]}</p> : null}
      </fieldset>
      <div>
        <label htmlFor="receiveNotes" className="field-label">Notes on arrival (optional)</label>
        <textarea id="receiveNotes" className="field-input" rows={2} value={notes} onChange={(e) => setNotes(e.target.value)} />
      </div>
      {error ? <Notice tone="danger">{error}</Notice> : null}
      <Button type="submit" disabled={pending || !condition}>{pending ? 'Saving…' : 'Receive the core'}</Button>
    </form>
  );
}
