'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';

/** The rep verifies the repair although the after-test fell short; the reason is kept on the claim. */
export function AcceptByHandForm({ claimId, version }: { claimId: string; version: number }) {
  const router = useRouter();
  const [reason, setReason] = useState('');
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function send(e: React.FormEvent) {
    e.preventDefault();
    setPending(true);
    setError(null);
    const res = await fetch(`/api/claims/${claimId}/steps`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ type: 'ACCEPT_BY_HAND', version, reason }),
    });
    setPending(false);
    if (!res.ok) {
      const data = await res.json().catch(() => ({}));
      setError(data.fieldErrors?.reason?.[0] ?? data.error ?? 'That step did not go through.');
      router.refresh();
      return;
    }
    router.refresh();
  }

  return (
    <form onSubmit={send} className="space-y-3" data-testid="accept-by-hand">
      <Field label="Why the after-test is accepted" name="accept-reason" errors={error ? [error] : undefined} hint="The dealer and accounts see this reason. The labor credit is released with it.">
        <textarea id="accept-reason" name="accept-reason" className="field-input min-h-20" value={reason} onChange={(e) => setReason(e.target.value)} />
      </Field>
      <Button type="submit" variant="secondary" disabled={pending || reason.trim().length === 0}>
        {pending ? 'Working…' : 'Accept the after-test by hand'}
      </Button>
    </form>
  );
}
