'use client';

import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useRef, useState } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';

/**
 * Issues the memo exactly as shown (its fingerprint goes with the request). A second click or a
 * retry after a lost answer gets the same memo back; the server makes sure of it.
 */
export function IssueCreditButton({ claimId, version, draftHash, label, disabled }: { claimId: string; version: number; draftHash: string; label: string; disabled?: boolean }) {
  const router = useRouter();
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [issued, setIssued] = useState<{ memoId: string; memoNumber: string } | null>(null);
  const inFlight = useRef(false);

  async function issue() {
    if (inFlight.current) return;
    inFlight.current = true;
    setPending(true);
    setError(null);
    try {
      const res = await fetch(`/api/claims/${claimId}/steps`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ type: 'ISSUE_CREDIT', version, draftHash }),
      });
      const data = await res.json().catch(() => ({}));
      if (!res.ok) setError(data.error ?? 'The memo was not issued.');
      else {
        setIssued({ memoId: data.memoId, memoNumber: data.memoNumber });
        // The page shows the issued memo in place of the draft; say so there.
        router.replace(`/accounts/claims/${claimId}?issued=${encodeURIComponent(data.memoNumber)}`);
        return;
      }
    } catch {
      setError('No answer from the server. Press again: the same memo is never issued twice.');
    } finally {
      inFlight.current = false;
      setPending(false);
      router.refresh();
    }
  }

  if (issued) {
    return (
      <Notice tone="success" title={`Memo ${issued.memoNumber} issued`}>
        The dealer has been told. <Link href={`/accounts/memos/${issued.memoId}`} className="font-bold underline">Open the memo</Link>
      </Notice>
    );
  }
  return (
    <div className="space-y-2">
      <Button type="button" onClick={issue} disabled={pending || disabled} data-testid="issue-credit">
        {pending ? 'Issuing…' : label}
      </Button>
      {error ? <Notice tone="danger">{error}</Notice> : null}
    </div>
  );
}
