'use client';

import { useActionState, useEffect, useRef, useState } from 'react';
import { liabilityEntryAction } from '@/app/(app)/accounts/actions';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';

export function LiabilityEntryForm({ today }: { today: string }) {
  const [state, action, pending] = useActionState(liabilityEntryAction, undefined);
  const form = useRef<HTMLFormElement>(null);
  // One key per entry: a double click or a resent form records it once; the next entry gets a new key.
  const [clientKey, setClientKey] = useState(() => crypto.randomUUID());
  useEffect(() => {
    if (!state?.ok) return;
    form.current?.reset();
    setClientKey(crypto.randomUUID());
  }, [state]);
  return (
    <form ref={form} action={action} className="grid gap-3 md:grid-cols-[10rem_14rem_10rem_1fr_auto] md:items-end" data-testid="liability-entry-form">
      <input type="hidden" name="clientKey" value={clientKey} />
      <TextField label="Date" name="entryDate" type="date" defaultValue={today} errors={state?.fieldErrors?.entryDate} />
      <SelectField
        label="Entry"
        name="kind"
        options={[
          { value: 'accrual', label: 'Accrual for warranties issued' },
          { value: 'change_in_estimate', label: 'Change in estimate (±)' },
          { value: 'opening_balance', label: 'Starting balance' },
        ]}
        errors={state?.fieldErrors?.kind}
      />
      <TextField label="Amount" name="amount" inputMode="decimal" placeholder="3200.00" errors={state?.fieldErrors?.amount} />
      <TextField label="What it is for" name="note" errors={state?.fieldErrors?.note} />
      <Button type="submit" variant="secondary" disabled={pending}>{pending ? 'Saving…' : 'Record'}</Button>
      {state?.message ? <Notice tone={state.ok ? 'success' : 'danger'} className="md:col-span-5">{state.message}</Notice> : null}
    </form>
  );
}
