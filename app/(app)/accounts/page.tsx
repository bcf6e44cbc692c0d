import type { Metadata } from 'next';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireRole } from '@/lib/auth/session';

export const metadata: Metadata = { title: 'Credits' };

export default async function AccountsPage() {
  const user = await requireRole('accountant');
  return (
    <>
      <PageHeader title="Credits" lead={`Dealer credits and chargebacks for ${user.orgName}.`} />
      <EmptyState title="No credits to issue">
        When a claim’s replacement is verified and its core is dealt with, it comes here to be credited: parts, labor at the
        agreed rate and freight, less any chargeback. Dealer statements are matched here too.
      </EmptyState>
    </>
  );
}
