'use client';

import { saveModelAction } from '@/app/(app)/catalog/actions';
import { ButtonLink } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { useKeptForm } from '@/components/ui/use-kept-form';
import { LEGAL_CLASS_IDS, LEGAL_CLASS_LABELS } from '@/lib/catalog';
import type { BikeModel } from '@/lib/db/catalog';
import { Checkbox, FormNotice, SaveButton } from './form-bits';

export function ModelForm({ model }: { model?: BikeModel }) {
  const { state, pending, ref, onSubmit } = useKeptForm(saveModelAction, { resetOnSuccess: !model });
  const e = state?.fieldErrors;
  return (
    <form ref={ref} onSubmit={onSubmit} className="space-y-4" noValidate>
      <FormNotice state={state} />
      {model ? <input type="hidden" name="id" value={model.id} /> : null}
      <div className="grid grid-cols-2 gap-3">
        <TextField label="Model code" name="code" defaultValue={model?.code} errors={e?.code} hint="As on the registry file." inputClassName="font-mono" />
        <TextField label="Model year" name="modelYear" type="number" defaultValue={model?.modelYear ?? ''} errors={e?.modelYear} />
      </div>
      <TextField label="Model name" name="name" defaultValue={model?.name} errors={e?.name} />
      <SelectField
        label="Sold as"
        name="legalClass"
        defaultValue={model?.legalClass ?? 'eu_pedelec'}
        options={LEGAL_CLASS_IDS.map((c) => ({ value: c, label: LEGAL_CLASS_LABELS[c] }))}
        errors={e?.legalClass}
        hint="A dyno run above this class’s assist limit is flagged to the rep as possible limiter tampering."
      />
      <TextField
        label="Tyre size"
        name="tyreSize"
        defaultValue={model?.tyreSize}
        placeholder="57-622"
        errors={e?.tyreSize}
        hint="ISO 5775 width-bead seat in mm (e.g. 57-622), or 29 x 2.25 / 700 x 35C, which are converted."
        inputClassName="font-mono"
      />
      <Checkbox name="active" label="Offered when filing claims" defaultChecked={model ? model.active : true} />
      <div className="flex gap-2">
        <SaveButton pending={pending}>{model ? 'Save model' : 'Add model'}</SaveButton>
        {model ? <ButtonLink href="/catalog/models" variant="quiet">Done</ButtonLink> : null}
      </div>
    </form>
  );
}
