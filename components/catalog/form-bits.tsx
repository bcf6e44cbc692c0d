'use client';

import type { ReactNode } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import type { ActionState } from '@/lib/validation/action';

/** The outcome of the last save: what was saved, or what stopped it (field messages sit by their fields). */
export function FormNotice({ state }: { state: ActionState }) {
  if (!state?.message) return null;
  const general = state.fieldErrors?._form;
  return (
    <Notice tone={state.ok ? 'success' : 'danger'}>
      {state.message}
      {general?.length ? <ul className="mt-1 list-disc pl-5">{general.map((g) => <li key={g}>{g}</li>)}</ul> : null}
    </Notice>
  );
}

export function SaveButton({ children, pending, pendingLabel = 'Saving…' }: { children: ReactNode; pending: boolean; pendingLabel?: string }) {
  return (
    <Button type="submit" disabled={pending}>
      {pending ? pendingLabel : children}
    </Button>
  );
}

export function Checkbox({ name, label, defaultChecked, hint }: { name: string; label: ReactNode; defaultChecked?: boolean; hint?: ReactNode }) {
  return (
    <label className="flex items-start gap-2 text-sm">
      <input type="checkbox" name={name} defaultChecked={defaultChecked} className="mt-0.5 size-4 accent-charge-600" />
      <span>
        {label}
        {hint ? <span className="block text-xs text-ink-muted">{hint}</span> : null}
      </span>
    </label>
  );
}

/** A number with the unit it is typed in, side by side. */
export function NumberWithUnit({
  label, name, unitName, units, defaultValue, defaultUnit, errors, hint, step = 'any', onValue,
}: {
  label: string; name: string; unitName?: string; units: { value: string; label: string }[]; defaultValue?: string; defaultUnit?: string;
  errors?: string[]; hint?: ReactNode; step?: string; onValue?: (v: string) => void;
}) {
  return (
    <div>
      <label htmlFor={name} className="field-label">{label}</label>
      <div className="flex gap-2">
        <input id={name} name={name} type="number" inputMode="decimal" step={step} min="0" defaultValue={defaultValue} onChange={onValue ? (e) => onValue(e.target.value) : undefined} aria-invalid={!!errors?.length} className={`field-input ${errors?.length ? 'border-fault-500' : ''}`} />
        {units.length > 1 && unitName ? (
          <select name={unitName} aria-label={`${label}: unit`} defaultValue={defaultUnit} className="field-input w-28 shrink-0">
            {units.map((u) => <option key={u.value} value={u.value}>{u.label}</option>)}
          </select>
        ) : (
          <span className="flex w-16 shrink-0 items-center text-sm text-ink-muted">{units[0]?.label}</span>
        )}
      </div>
      {hint && !errors?.length ? <p className="mt-1 text-xs text-ink-muted">{hint}</p> : null}
      {errors?.map((e) => <p key={e} className="field-error" role="alert">{e}</p>)}
    </div>
  );
}
