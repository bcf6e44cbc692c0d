'use client';

import { laborRateAction } from '@/app/(app)/catalog/actions';
import { ButtonLink } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { useKeptForm } from '@/components/ui/use-kept-form';
import { FormNotice, SaveButton } from './form-bits';

export function LaborRateForm({ accountId, dealerName, rate, currency, cap }: { accountId: string; dealerName: string; rate: string; currency: string; cap: string }) {
  const { state, pending, ref, onSubmit } = useKeptForm(laborRateAction);
  return (
    <form ref={ref} onSubmit={onSubmit} className="space-y-4" noValidate>
      <FormNotice state={state} />
      <input type="hidden" name="accountId" value={accountId} />
      <TextField
        label={`Agreed labor rate for ${dealerName} (${currency} an hour)`}
        name="laborRate"
        defaultValue={rate}
        errors={state?.fieldErrors?.laborRate}
        inputClassName="figure"
        hint={`Credits pay scheduled hours × this rate, at most ${cap} an hour.`}
      />
      <div className="flex gap-2">
        <SaveButton pending={pending}>Save rate</SaveButton>
        <ButtonLink href="/catalog/dealers" variant="quiet">Done</ButtonLink>
      </div>
    </form>
  );
}
