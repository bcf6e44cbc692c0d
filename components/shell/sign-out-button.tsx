'use client';

import { signOut } from 'next-auth/react';

export function SignOutButton() {
  return (
    <button type="button" onClick={() => signOut({ callbackUrl: '/signin' })} className="rounded-md px-3 py-2 text-sm text-paper/80 hover:bg-paper/10 hover:text-paper">
      Sign out
    </button>
  );
}
