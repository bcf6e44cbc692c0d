'use client';

import { inviteAction } from '@/app/(app)/people/actions';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { useKeptForm } from '@/components/ui/use-kept-form';

export function InviteForm({ roles }: { roles: { value: string; label: string; description: string }[] }) {
  // A refused invitation keeps the name and e-mail typed; a sent one clears the form.
  const { state, pending, ref, onSubmit } = useKeptForm(inviteAction, { resetOnSuccess: true });
  return (
    <form ref={ref} onSubmit={onSubmit} className="space-y-4">
      {state?.message ? <Notice tone={state.ok ? 'success' : 'danger'}>{state.message}</Notice> : null}
      <TextField label="Name" name="name" required errors={state?.fieldErrors?.name} />
      <TextField label="E-mail" name="email" type="email" required errors={state?.fieldErrors?.email} />
      <SelectField
        label="Role"
        name="role"
        options={roles.map((r) => ({ value: r.value, label: r.label }))}
        errors={state?.fieldErrors?.role}
        hint={
          <span className="block space-y-0.5">
            {roles.map((r) => (
              <span key={r.value} className="block">
                <b>{r.label}:</b> {r.description}
              </span>
            ))}
          </span>
        }
      />
      <Button type="submit" disabled={pending}>
        {pending ? 'Sending…' : 'Send invitation'}
      </Button>
      <p className="text-xs text-ink-muted">They get an e-mail with a link to choose a password. The link works once, for 7 days.</p>
    </form>
  );
}
