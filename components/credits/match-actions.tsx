'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Button } from '@/components/ui/button';

/** Confirm or reject one proposed match; a refusal is shown as the server worded it. */
export function MatchActions({ matchId, memoNumber }: { matchId: string; memoNumber: string }) {
  const router = useRouter();
  const [pending, setPending] = useState<'confirm' | 'reject' | null>(null);
  const [error, setError] = useState<string | null>(null);

  async function decide(action: 'confirm' | 'reject') {
    if (pending) return;
    setPending(action);
    setError(null);
    const res = await fetch(`/api/accounts/matches/${matchId}`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ action }),
    }).catch(() => null);
    const data = res ? await res.json().catch(() => ({})) : {};
    if (!res?.ok) setError(data.error ?? 'No answer from the server; nothing changed.');
    setPending(null);
    router.refresh();
  }

  return (
    <div className="flex flex-wrap items-center gap-2">
      <Button type="button" onClick={() => decide('confirm')} disabled={pending !== null} aria-label={`Confirm the match with ${memoNumber}`}>
        {pending === 'confirm' ? 'Confirming…' : 'Confirm'}
      </Button>
      <Button type="button" variant="quiet" onClick={() => decide('reject')} disabled={pending !== null} aria-label={`Reject the match with ${memoNumber}`}>
        {pending === 'reject' ? 'Rejecting…' : 'Reject'}
      </Button>
      {error ? <p className="w-full text-sm text-fault-700" role="alert">{error}</p> : null}
    </div>
  );
}
