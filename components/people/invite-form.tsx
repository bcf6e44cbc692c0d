'use client';

import { useActionState, useEffect, useRef } from 'react';
import { inviteAction } from '@/app/(app)/people/actions';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';

export function InviteForm({ roles }: { roles: { value: string; label: string; description: string }[] }) {
  const [state, action, pending] = useActionState(inviteAction, undefined);
  const form = useRef<HTMLFormElement>(null);
  useEffect(() => {
    if (state?.ok) form.current?.reset();
  }, [state]);
  return (
    <form ref={form} action={action} className="space-y-4">
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
