'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';

export type StepResult = { ok: true; data: Record<string, unknown> } | { ok: false; error: string; fieldErrors: Record<string, string[]> };

/**
 * Sends one claim step to the server and refreshes the page on success. A refusal keeps the form
 * as it was and shows the server's own words, with the fields it names.
 */
export function useStep(claimId: string) {
  const router = useRouter();
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string[]>>({});

  async function send(type: string, version: number, payload: Record<string, unknown>): Promise<StepResult> {
    setPending(true);
    setError(null);
    setFieldErrors({});
    try {
      const res = await fetch(`/api/claims/${claimId}/steps`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ type, version, ...payload }),
      });
      const data = await res.json().catch(() => ({}));
      if (!res.ok) {
        const message = data.error ?? 'That did not go through; nothing was changed.';
        setError(res.status === 409 && data.version !== undefined && data.version !== version ? `${message} Reload to see the latest.` : message);
        setFieldErrors(data.fieldErrors ?? {});
        return { ok: false, error: message, fieldErrors: data.fieldErrors ?? {} };
      }
      router.refresh();
      return { ok: true, data };
    } catch {
      const message = 'The server could not be reached; nothing was changed. Try again.';
      setError(message);
      return { ok: false, error: message, fieldErrors: {} };
    } finally {
      setPending(false);
    }
  }

  return { send, pending, error, fieldErrors };
}
