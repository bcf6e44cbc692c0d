'use client';

import { addHolidayAction, removeHolidayAction } from '@/app/(app)/catalog/actions';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { useKeptForm } from '@/components/ui/use-kept-form';
import { FormNotice, SaveButton } from './form-bits';

export function HolidayForm() {
  const { state, pending, ref, onSubmit } = useKeptForm(addHolidayAction, { resetOnSuccess: true });
  const e = state?.fieldErrors;
  return (
    <form ref={ref} onSubmit={onSubmit} className="space-y-4" noValidate>
      <FormNotice state={state} />
      <TextField label="Day" name="day" type="date" errors={e?.day} />
      <TextField label="Name" name="name" placeholder="Company closure" errors={e?.name} />
      <SaveButton pending={pending}>Add day off</SaveButton>
    </form>
  );
}

export function RemoveHolidayButton({ day, name }: { day: string; name: string }) {
  const { state, pending, onSubmit } = useKeptForm(removeHolidayAction);
  return (
    <form onSubmit={onSubmit} className="inline-flex flex-col items-end">
      <input type="hidden" name="day" value={day} />
      <Button type="submit" variant="quiet" disabled={pending} aria-label={`Remove ${name} (${day})`} className="min-h-8 px-2 py-1">
        {pending ? 'Removing…' : 'Remove'}
      </Button>
      {state && !state.ok ? <span className="text-xs text-fault-700" role="alert">{state.message}</span> : null}
    </form>
  );
}
