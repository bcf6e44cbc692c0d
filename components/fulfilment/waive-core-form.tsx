'use client';

import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { useStep } from './use-step';

/** The rep lets the core stay with the dealer, with a photo of the recycling or scrapping as proof. */
export function WaiveCoreForm({ claimId, version, proofs }: { claimId: string; version: number; proofs: { id: string; fileName: string }[] }) {
  const { send, pending, error, fieldErrors } = useStep(claimId);
  const [reason, setReason] = useState('');
  const [picked, setProof] = useState('');
  // A proof uploaded after the form appeared arrives through a refresh: default to the newest one.
  const proof = proofs.some((p) => p.id === picked) ? picked : (proofs.at(-1)?.id ?? '');

  return (
    <form
      onSubmit={(e) => {
        e.preventDefault();
        void send('WAIVE_CORE', version, { reason, proofAttachmentId: proof });
      }}
      className="space-y-3"
      data-testid="waive-form"
    >
      <fieldset className="space-y-1">
        <legend className="field-label">Why the core stays with the dealer</legend>
        <label className="flex items-center gap-2 text-sm"><input type="radio" name="reason" checked={reason === 'local_recycling'} onChange={() => setReason('local_recycling')} /> Recycled locally (common for batteries)</label>
        <label className="flex items-center gap-2 text-sm"><input type="radio" name="reason" checked={reason === 'scrapped_at_shop'} onChange={() => setReason('scrapped_at_shop')} /> Scrapped at the shop</label>
      </fieldset>
      <div>
        <label htmlFor="proof" className="field-label">Proof photo</label>
        {proofs.length ? (
          <select id="proof" className="field-input" value={proof} onChange={(e) => setProof(e.target.value)}>
            {proofs.map((p) => (
              <option key={p.id} value={p.id}>{p.fileName}</option>
            ))}
          </select>
        ) : (
          <p className="text-sm text-ink-muted">No proof photo yet: add one above (the dealer can add it too).</p>
        )}
        {fieldErrors.proofAttachmentId ? <p className="field-error" role="alert">{fieldErrors.proofAttachmentId[0]}</p> : null}
      </div>
      {error ? <Notice tone="danger">{error}</Notice> : null}
      <Button type="submit" variant="secondary" disabled={pending || !reason || !proof}>{pending ? 'Saving…' : 'Waive the core return'}</Button>
    </form>
  );
}
