'use client';

import { startTransition, useActionState, useEffect, useRef, type FormEvent } from 'react';
import type { ActionState } from '@/lib/validation/action';

type Action = (prev: ActionState, formData: FormData) => Promise<ActionState>;

/**
 * A server action behind a form that keeps what was typed when the server refuses it.
 * (React resets a form after a `<form action>` submission whatever the outcome; submitting
 * through onSubmit avoids that.) `resetOnSuccess` clears the form after a successful create.
 */
export function useKeptForm(action: Action, opts: { resetOnSuccess?: boolean } = {}) {
  const [state, dispatch, pending] = useActionState(action, undefined);
  const ref = useRef<HTMLFormElement>(null);
  useEffect(() => {
    if (state?.ok && opts.resetOnSuccess) ref.current?.reset();
  }, [state, opts.resetOnSuccess]);
  const onSubmit = (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const data = new FormData(e.currentTarget);
    startTransition(() => dispatch(data));
  };
  return { state, pending, ref, onSubmit };
}
