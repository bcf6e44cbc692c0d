'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Button } from '@/components/ui/button';

/** Names the memo a statement line pays; the proposal then waits for confirmation like any other. */
export function ChooseMemoForm({ lineId, candidates }: { lineId: string; candidates: string[] }) {
  const router = useRouter();
  const [number, setNumber] = useState('');
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function choose(memoNumber: string) {
    if (pending) return;
    setPending(true);
    setError(null);
    const res = await fetch(`/api/accounts/statement-lines/${lineId}/memo`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ memoNumber }),
    }).catch(() => null);
    const data = res ? await res.json().catch(() => ({})) : {};
    setPending(false);
    if (!res?.ok) return setError(data.error ?? 'No answer from the server; nothing changed.');
    setNumber('');
    router.refresh();
  }

  return (
    <div className="space-y-1">
      {candidates.length ? (
        <div className="flex flex-wrap gap-1">
          {candidates.map((c) => (
            <button key={c} type="button" onClick={() => choose(c)} disabled={pending} className="rounded border border-paper-line bg-paper-raised px-2 py-0.5 font-mono text-xs hover:bg-charge-50">
              {c}
            </button>
          ))}
        </div>
      ) : null}
      <form
        className="flex gap-1"
        onSubmit={(e) => {
          e.preventDefault();
          if (number.trim()) choose(number.trim());
        }}
      >
        <input value={number} onChange={(e) => setNumber(e.target.value)} placeholder="CM-…" aria-label="Memo number" className="field-input max-w-44 py-1 font-mono text-xs" />
        <Button type="submit" variant="secondary" disabled={pending || !number.trim()} className="min-h-8 px-2 py-1 text-xs">
          Match
        </Button>
      </form>
      {error ? <p className="text-xs text-fault-700" role="alert">{error}</p> : null}
    </div>
  );
}
