'use client';

import { signIn } from 'next-auth/react';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';

export function SignInForm({ next, initialError, defaultEmail }: { next?: string; initialError?: string; defaultEmail?: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | undefined>(initialError);
  const [pending, setPending] = useState(false);

  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    setPending(true);
    setError(undefined);
    const res = await signIn('credentials', {
      email: String(form.get('email') ?? ''),
      password: String(form.get('password') ?? ''),
      redirect: false,
    });
    setPending(false);
    if (!res || res.error) {
      setError(res?.error && res.error !== 'CredentialsSignin' ? res.error : 'Sign-in failed. Check your e-mail and password.');
      return;
    }
    router.replace(next ?? '/');
    router.refresh();
  }

  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate>
      {error ? <Notice tone="danger">{error}</Notice> : null}
      <TextField label="E-mail" name="email" type="email" autoComplete="username" required autoFocus={!defaultEmail} defaultValue={defaultEmail} />
      <TextField label="Password" name="password" type="password" autoComplete="current-password" required autoFocus={!!defaultEmail} />
      <Button type="submit" className="w-full" disabled={pending}>
        {pending ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}
