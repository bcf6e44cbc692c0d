'use client';

import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { useStep } from './use-step';

const RESULTS = [
  { value: 'fault_confirmed', label: 'Fault confirmed', hint: 'The part fails as the dealer reported.' },
  { value: 'no_fault_found', label: 'No fault found', hint: 'Works to spec on the bench: leads to a chargeback.' },
  { value: 'not_covered', label: 'Damage not covered', hint: 'Impact, water, tampering: leads to a chargeback.' },
] as const;

/** The inspection result, with notes (required unless the fault is confirmed) and at least one photo. */
export function InspectForm({ claimId, version, photoCount }: { claimId: string; version: number; photoCount: number }) {
  const { send, pending, error, fieldErrors } = useStep(claimId);
  const [result, setResult] = useState<string>('');
  const [notes, setNotes] = useState('');
  const needsNotes = result !== '' && result !== 'fault_confirmed';

  return (
    <form
      onSubmit={(e) => {
        e.preventDefault();
        void send('INSPECT', version, { result, notes: notes || undefined });
      }}
      className="space-y-3"
      data-testid="inspect-form"
    >
      <fieldset>
        <legend className="field-label">Result</legend>
        <div className="grid gap-2 sm:grid-cols-3">
          {RESULTS.map((r) => (
            <label key={r.value} className={`flex cursor-pointer gap-2 rounded-md border px-3 py-2 text-sm ${result === r.value ? 'border-charge-500 bg-charge-50' : 'border-paper-line bg-paper-raised'}`}>
              <input type="radio" name="result" value={r.value} checked={result === r.value} onChange={() => setResult(r.value)} className="mt-1" />
              <span>
                <span className="font-bold">{r.label}</span>
                <span className="block text-xs text-ink-muted">{r.hint}</span>
              </span>
            </label>
          ))}
        </div>
      </fieldset>
      <div>
        <label htmlFor="inspectNotes" className="field-label">Inspection notes{needsNotes ? ' (required: they justify the chargeback)' : ''}</label>
        <textarea id="inspectNotes" className="field-input" rows={3} value={notes} onChange={(e) => setNotes(e.target.value)} />
        {fieldErrors.notes ? <p className="field-error" role="alert">{fieldErrors.notes[0]}</p> : null}
      </div>
      <p className={`text-sm ${photoCount ? 'text-ink-muted' : 'font-bold text-volt-700'}`}>
        {photoCount ? `${photoCount} inspection photo${photoCount === 1 ? '' : 's'} on the claim.` : 'Add at least one inspection photo above first.'}
      </p>
      {error ? <Notice tone="danger">{error}</Notice> : null}
      <Button type="submit" disabled={pending || !result || (needsNotes && !notes.trim()) || photoCount === 0}>{pending ? 'Saving…' : 'Record the inspection'}</Button>
    </form>
  );
}
