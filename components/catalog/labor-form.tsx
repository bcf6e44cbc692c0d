'use client';

import { saveLaborAction } from '@/app/(app)/catalog/actions';
import { ButtonLink } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { useKeptForm } from '@/components/ui/use-kept-form';
import { CATEGORY_NAMES } from '@/lib/catalog';
import { PART_CATEGORIES } from '@/lib/coverage';
import type { LaborOperation } from '@/lib/db/catalog';
import { Checkbox, FormNotice, SaveButton } from './form-bits';

export function LaborForm({ operation }: { operation?: LaborOperation }) {
  const { state, pending, ref, onSubmit } = useKeptForm(saveLaborAction, { resetOnSuccess: !operation });
  const e = state?.fieldErrors;
  return (
    <form ref={ref} onSubmit={onSubmit} className="space-y-4" noValidate>
      <FormNotice state={state} />
      {operation ? <input type="hidden" name="id" value={operation.id} /> : null}
      <div className="grid grid-cols-2 gap-3">
        <TextField label="Operation code" name="code" defaultValue={operation?.code} errors={e?.code} inputClassName="font-mono" />
        <TextField label="Standard hours" name="standardHours" defaultValue={operation?.standardHours} placeholder="1.20" errors={e?.standardHours} inputClassName="figure" hint="Paid flat, whatever the job took." />
      </div>
      <TextField label="Description" name="description" defaultValue={operation?.description} errors={e?.description} />
      <SelectField
        label="For which kind of part"
        name="category"
        defaultValue={operation?.category ?? ''}
        options={[{ value: '', label: 'Any part' }, ...PART_CATEGORIES.map((c) => ({ value: c, label: CATEGORY_NAMES[c] }))]}
        errors={e?.category}
      />
      <Checkbox name="active" label="Offered when filing claims" defaultChecked={operation ? operation.active : true} />
      <div className="flex gap-2">
        <SaveButton pending={pending}>{operation ? 'Save operation' : 'Add operation'}</SaveButton>
        {operation ? <ButtonLink href="/catalog/labor" variant="quiet">Done</ButtonLink> : null}
      </div>
    </form>
  );
}
