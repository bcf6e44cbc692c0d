'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';

/** Sends one lifecycle step; a refusal is shown as the server worded it, and nothing changes. */
export function StepButton({
  claimId, type, version, label, payload, variant = 'primary', disabled, confirm,
}: {
  claimId: string;
  type: string;
  version: number;
  label: string;
  payload?: Record<string, unknown>;
  variant?: 'primary' | 'secondary' | 'danger' | 'quiet';
  disabled?: boolean;
  confirm?: string;
}) {
  const router = useRouter();
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function send() {
    if (confirm && !window.confirm(confirm)) return;
    setPending(true);
    setError(null);
    const res = await fetch(`/api/claims/${claimId}/steps`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ type, version, ...payload }),
    });
    setPending(false);
    if (!res.ok) {
      const data = await res.json().catch(() => ({}));
      setError(data.error ?? 'That step did not go through.');
      router.refresh();
      return;
    }
    router.refresh();
  }

  return (
    <div className="space-y-2">
      <Button type="button" variant={variant} onClick={send} disabled={pending || disabled}>
        {pending ? 'Working…' : label}
      </Button>
      {error ? <Notice tone="danger">{error}</Notice> : null}
    </div>
  );
}
