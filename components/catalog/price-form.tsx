'use client';

import { addPriceAction } from '@/app/(app)/catalog/actions';
import { SelectField, TextField } from '@/components/ui/field';
import { useKeptForm } from '@/components/ui/use-kept-form';
import { FormNotice, SaveButton } from './form-bits';

export function PriceForm({ parts, currency, today }: { parts: { id: string; label: string }[]; currency: string; today: string }) {
  const { state, pending, ref, onSubmit } = useKeptForm(addPriceAction, { resetOnSuccess: true });
  const e = state?.fieldErrors;
  return (
    <form ref={ref} onSubmit={onSubmit} className="space-y-4" noValidate>
      <FormNotice state={state} />
      <SelectField label="Part" name="partId" options={[{ value: '', label: 'Choose a part…' }, ...parts.map((p) => ({ value: p.id, label: p.label }))]} errors={e?.partId} />
      <div className="grid grid-cols-2 gap-3">
        <TextField label={`Net price (${currency})`} name="netPrice" placeholder="54.90" errors={e?.netPrice} inputClassName="figure" hint="A dot for decimals." />
        <TextField label="Effective from" name="effectiveFrom" type="date" defaultValue={today} errors={e?.effectiveFrom} />
      </div>
      <p className="text-xs text-ink-muted">
        A new price applies to claims whose part is fitted from the shop’s own stock from that day on; earlier entries stay as
        the record of what applied before.
      </p>
      <SaveButton pending={pending}>Add price</SaveButton>
    </form>
  );
}
