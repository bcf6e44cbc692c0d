'use client';

import { useActionState } from 'react';
import { reverseMemoAction } from '@/app/(app)/accounts/actions';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';

/** An issued memo is never edited: it is corrected by a memo that reverses it. */
export function ReverseMemoForm({ memoId, number }: { memoId: string; number: string }) {
  const [state, action, pending] = useActionState(reverseMemoAction, undefined);
  return (
    <details className="rounded-md border border-paper-line p-3 print:hidden">
      <summary className="cursor-pointer text-sm font-bold text-charge-700">Reverse {number}…</summary>
      <form action={action} className="mt-3 space-y-3">
        <input type="hidden" name="memoId" value={memoId} />
        <p className="text-sm text-ink-muted">
          A reversing memo negates every line that posts, so the two add up to exactly zero. Then a corrected memo can be issued.
        </p>
        <TextField label="Why it is reversed" name="reason" errors={state?.fieldErrors?.reason} />
        <Button type="submit" variant="danger" disabled={pending}>
          {pending ? 'Reversing…' : `Issue the reversing memo`}
        </Button>
        {state?.message ? <Notice tone={state.ok ? 'success' : 'danger'}>{state.message}</Notice> : null}
      </form>
    </details>
  );
}
