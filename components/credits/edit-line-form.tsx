'use client';

import { useActionState } from 'react';
import { editLineAction } from '@/app/(app)/accounts/actions';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';

/** Changes what one draft line posts; the computed value and the reason stay on the line. */
export function EditLineForm({ claimId, lineNo, current, chargeback }: { claimId: string; lineNo: number; current: string; chargeback: boolean }) {
  const [state, action, pending] = useActionState(editLineAction, undefined);
  const id = (f: string) => `line-${lineNo}-${f}`;
  const errors = (f: string) =>
    state?.fieldErrors?.[f]?.map((e) => (
      <p key={e} className="field-error" role="alert">
        {e}
      </p>
    ));
  return (
    <form action={action} className="mt-2 grid gap-2 rounded-md bg-paper-sunk p-3 sm:grid-cols-[9rem_1fr_auto] sm:items-end" data-testid={`edit-line-${lineNo}`}>
      <input type="hidden" name="claimId" value={claimId} />
      <input type="hidden" name="lineNo" value={lineNo} />
      <div>
        <label htmlFor={id('amount')} className="field-label">Posts instead</label>
        <input id={id('amount')} name="amount" defaultValue={current} inputMode="decimal" className="field-input" aria-invalid={!!state?.fieldErrors?.amount} />
        {chargeback ? <p className="mt-1 text-xs text-ink-muted">Negative: what the dealer owes.</p> : null}
        {errors('amount')}
      </div>
      <div>
        <label htmlFor={id('reason')} className="field-label">Why (the dealer sees this)</label>
        <input id={id('reason')} name="reason" className="field-input" placeholder="e.g. the freight invoice shows 12.00" aria-invalid={!!state?.fieldErrors?.reason} />
        {errors('reason')}
      </div>
      <Button type="submit" variant="secondary" disabled={pending}>
        {pending ? 'Saving…' : 'Save the change'}
      </Button>
      {state?.message ? <Notice tone={state.ok ? 'success' : 'danger'} className="sm:col-span-3">{state.message}</Notice> : null}
    </form>
  );
}
