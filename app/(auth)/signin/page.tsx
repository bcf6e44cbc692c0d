import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { SignInForm } from '@/components/auth/sign-in-form';
import { Notice } from '@/components/ui/notice';
import { HOME_PATH } from '@/lib/auth/roles';
import { safeNextPath } from '@/lib/auth/safe-next';
import { currentUser } from '@/lib/auth/session';

export const metadata: Metadata = { title: 'Sign in' };

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ next?: string; error?: string; welcome?: string; email?: string }> }) {
  const user = await currentUser();
  if (user) redirect(HOME_PATH[user.role]);
  const { next, error, welcome, email } = await searchParams;
  const safeNext = safeNextPath(next);
  return (
    <>
      <h1>Sign in</h1>
      <p className="mt-1 mb-6 text-ink-muted">Use the e-mail your shop or brand admin set up for you.</p>
      {welcome ? (
        <Notice tone="success" className="mb-4">
          Your password is saved. Sign in with it now.
        </Notice>
      ) : null}
      <SignInForm next={safeNext} defaultEmail={email} initialError={error && error !== 'CredentialsSignin' ? error : undefined} />
    </>
  );
}
