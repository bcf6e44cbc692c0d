import clsx from 'clsx';
import type { ComponentProps, ReactNode } from 'react';

type FieldProps = { label: string; name: string; errors?: string[]; hint?: ReactNode; className?: string };

export function Field({ label, name, errors, hint, className, children }: FieldProps & { children: ReactNode }) {
  return (
    <div className={className}>
      <label htmlFor={name} className="field-label">
        {label}
      </label>
      {children}
      {hint && !errors?.length ? <p className="mt-1 text-xs text-ink-muted">{hint}</p> : null}
      {errors?.map((e) => (
        <p key={e} className="field-error" role="alert">
          {e}
        </p>
      ))}
    </div>
  );
}

export function TextField({ label, name, errors, hint, className, inputClassName, ...input }: FieldProps & ComponentProps<'input'> & { inputClassName?: string }) {
  return (
    <Field label={label} name={name} errors={errors} hint={hint} className={className}>
      <input id={name} name={name} className={clsx('field-input', inputClassName, errors?.length && 'border-fault-500')} aria-invalid={!!errors?.length} {...input} />
    </Field>
  );
}

export function SelectField({
  label, name, errors, hint, className, options, ...select
}: FieldProps & ComponentProps<'select'> & { options: { value: string; label: string }[] }) {
  return (
    <Field label={label} name={name} errors={errors} hint={hint} className={className}>
      <select id={name} name={name} className={clsx('field-input', errors?.length && 'border-fault-500')} aria-invalid={!!errors?.length} {...select}>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </Field>
  );
}
