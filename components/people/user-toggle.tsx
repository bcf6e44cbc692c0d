'use client';

import { useActionState } from 'react';
import { setDisabledAction } from '@/app/(app)/people/actions';
import { Button } from '@/components/ui/button';

export function UserToggle({ userId, disabled, name }: { userId: string; disabled: boolean; name: string }) {
  const [state, action, pending] = useActionState(setDisabledAction, undefined);
  return (
    <form action={action} className="inline-flex flex-col items-end gap-1">
      <input type="hidden" name="userId" value={userId} />
      <input type="hidden" name="disabled" value={disabled ? 'false' : 'true'} />
      <Button type="submit" variant={disabled ? 'secondary' : 'quiet'} disabled={pending} aria-label={`${disabled ? 'Switch on' : 'Switch off'} ${name}`}>
        {disabled ? 'Switch on' : 'Switch off'}
      </Button>
      {state?.ok === false && state.message ? <span className="text-xs text-fault-700">{state.message}</span> : null}
    </form>
  );
}
