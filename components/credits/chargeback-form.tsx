'use client';

import { useActionState } from 'react';
import { chargebackAction } from '@/app/(app)/accounts/actions';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { CHARGEBACK_REASON_OPTIONS } from './labels';

/** A chargeback found after the credit was issued: a memo of its own. */
export function ChargebackForm({ claimId }: { claimId: string }) {
  const [state, action, pending] = useActionState(chargebackAction, undefined);
  return (
    <details className="rounded-md border border-paper-line p-3">
      <summary className="cursor-pointer text-sm font-bold text-charge-700">Charge this claim back…</summary>
      <form action={action} className="mt-3 space-y-3">
        <input type="hidden" name="claimId" value={claimId} />
        <SelectField label="Why" name="reason" options={CHARGEBACK_REASON_OPTIONS} errors={state?.fieldErrors?.reason} />
        <TextField label="What was found (the dealer sees this)" name="note" errors={state?.fieldErrors?.note} />
        <p className="text-xs text-ink-muted">
          The approved parts are charged at dealer net on the repair date; no fault found and not covered also take back the labor credited. Freight stays with the dealer.
        </p>
        <Button type="submit" variant="danger" disabled={pending}>
          {pending ? 'Issuing…' : 'Issue the chargeback memo'}
        </Button>
        {state?.message ? <Notice tone={state.ok ? 'success' : 'danger'}>{state.message}</Notice> : null}
      </form>
    </details>
  );
}
