'use client';

import { savePolicyAction } from '@/app/(app)/catalog/actions';
import { ButtonLink } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { useKeptForm } from '@/components/ui/use-kept-form';
import { CATEGORY_NAMES } from '@/lib/catalog';
import { EXCLUSION_CODES, EXCLUSION_LABELS, type PartCategory } from '@/lib/coverage';
import type { WarrantyPolicy } from '@/lib/db/catalog';
import { Checkbox, FormNotice, SaveButton } from './form-bits';

/** The warranty terms for one kind of part. */
export function PolicyForm({ category, policy }: { category: PartCategory; policy: WarrantyPolicy | null }) {
  const { state, pending, ref, onSubmit } = useKeptForm(savePolicyAction);
  const e = state?.fieldErrors;
  const num = (v: number | null | undefined) => (v === null || v === undefined ? '' : String(v));
  return (
    <form ref={ref} onSubmit={onSubmit} className="space-y-4" noValidate aria-label={`Warranty terms for ${CATEGORY_NAMES[category]}`}>
      <FormNotice state={state} />
      <input type="hidden" name="category" value={category} />
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField label="Months covered from retail sale" name="coverageMonths" type="number" defaultValue={num(policy?.coverageMonths ?? 24)} errors={e?.coverageMonths} />
        <TextField label="Review deadline (business days)" name="reviewDays" type="number" defaultValue={num(policy?.reviewDays ?? 5)} errors={e?.reviewDays} hint="From submission to the rep’s decision." />
        <TextField label="Core return (days)" name="coreReturnDays" type="number" defaultValue={num(policy?.coreReturnDays ?? 15)} errors={e?.coreReturnDays} hint="From the return request to the core’s arrival." />
        <TextField label="Grace before chargeback (days)" name="coreGraceDays" type="number" defaultValue={num(policy?.coreGraceDays ?? 5)} errors={e?.coreGraceDays} hint="A reminder goes out first." />
        <TextField label="Appeal window (days)" name="appealDays" type="number" defaultValue={num(policy?.appealDays ?? 30)} errors={e?.appealDays} hint="After a denial; one appeal per claim." />
      </div>
      {category === 'battery' ? (
        <fieldset className="grid gap-3 rounded-md border border-paper-line p-3 sm:grid-cols-2">
          <legend className="px-1 text-sm font-bold">Battery wear</legend>
          <TextField label="Charge cycles covered" name="cycleLimit" type="number" defaultValue={num(policy?.cycleLimit)} errors={e?.cycleLimit} hint="The limit itself is still covered. Empty: no limit." />
          <TextField label="Capacity threshold (%)" name="capacityThresholdPct" type="number" step="0.01" defaultValue={num(policy?.capacityThresholdPct)} errors={e?.capacityThresholdPct} hint="Measured capacity below this share of rated is a covered fault." />
        </fieldset>
      ) : null}
      <fieldset className="space-y-2">
        <legend className="field-label">Not covered</legend>
        {EXCLUSION_CODES.map((c) => (
          <Checkbox key={c} name={`exclusion_${c}`} label={EXCLUSION_LABELS[c].charAt(0).toUpperCase() + EXCLUSION_LABELS[c].slice(1)} defaultChecked={policy?.exclusions.includes(c) ?? false} />
        ))}
      </fieldset>
      <div className="flex gap-2">
        <SaveButton pending={pending}>Save terms</SaveButton>
        <ButtonLink href="/catalog/policies" variant="quiet">Done</ButtonLink>
      </div>
    </form>
  );
}
