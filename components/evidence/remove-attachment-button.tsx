'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';

export function RemoveAttachmentButton({ claimId, attachmentId, name }: { claimId: string; attachmentId: string; name: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  async function remove() {
    if (!window.confirm(`Remove ${name} from this claim?`)) return;
    const res = await fetch(`/api/claims/${claimId}/attachments/${attachmentId}`, { method: 'DELETE' });
    if (!res.ok) setError((await res.json().catch(() => ({}))).error ?? 'Could not remove it.');
    router.refresh();
  }
  return (
    <span className="shrink-0 text-right">
      <button type="button" onClick={remove} className="text-xs font-bold text-fault-700 hover:underline" aria-label={`Remove ${name}`}>
        Remove
      </button>
      {error ? <span className="block text-xs text-fault-700">{error}</span> : null}
    </span>
  );
}
