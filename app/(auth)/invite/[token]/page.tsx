import type { Metadata } from 'next';
import Link from 'next/link';
import { AcceptInviteForm } from '@/components/auth/accept-invite-form';
import { Notice } from '@/components/ui/notice';
import { ROLE_LABELS } from '@/lib/auth/roles';
import { lookupInvitation } from '@/lib/services/people';

export const metadata: Metadata = { title: 'Choose your password' };

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const inv = await lookupInvitation(token);
  if (!inv.ok) {
    return (
      <>
        <h1>Invitation</h1>
        <Notice tone="danger" className="mt-4">
          {inv.message}
        </Notice>
        <p className="mt-4">
          <Link className="font-bold text-charge-700 underline" href="/signin">
            Go to sign-in
          </Link>
        </p>
      </>
    );
  }
  return (
    <>
      <h1>Welcome, {inv.name}</h1>
      <p className="mt-1 mb-6 text-ink-muted">
        You are joining <b>{inv.orgName}</b> as {ROLE_LABELS[inv.role]}. Choose a password for <b>{inv.email}</b>.
      </p>
      <AcceptInviteForm token={token} />
    </>
  );
}
