'use client';

import { useActionState } from 'react';
import { acceptInviteAction } from '@/app/(auth)/invite/actions';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { PASSWORD_MIN } from '@/lib/validation/people';

export function AcceptInviteForm({ token }: { token: string }) {
  const [state, action, pending] = useActionState(acceptInviteAction, undefined);
  return (
    <form action={action} className="space-y-4">
      {state?.message ? <Notice tone="danger">{state.message}</Notice> : null}
      <input type="hidden" name="token" value={token} />
      <TextField label="Password" name="password" type="password" autoComplete="new-password" required hint={`At least ${PASSWORD_MIN} characters.`} errors={state?.fieldErrors?.password} />
      <TextField label="Password again" name="confirm" type="password" autoComplete="new-password" required errors={state?.fieldErrors?.confirm} />
      <Button type="submit" className="w-full" disabled={pending}>
        {pending ? 'Saving…' : 'Save password'}
      </Button>
    </form>
  );
}
