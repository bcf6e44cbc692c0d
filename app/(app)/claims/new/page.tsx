import type { Metadata } from 'next';
import { ClaimForm } from '@/components/claims/claim-form';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireRole } from '@/lib/auth/session';
import { filingOptions } from '@/lib/services/filing';

export const metadata: Metadata = { title: 'New claim' };

export default async function NewClaimPage() {
  const user = await requireRole('dealer', 'dealer_admin');
  const options = await filingOptions(user);
  return (
    <>
      <PageHeader
        title="New warranty claim"
        lead="Type the frame serial first: a registered bike fills in its model and sale date. Save the draft, then add photos, the load test and any documents."
      />
      {options.length === 0 ? (
        <EmptyState title="No brand accounts yet">Your shop needs an account with a brand before it can file claims with it. Ask the brand to set one up.</EmptyState>
      ) : (
        <ClaimForm options={options} units={user.units} />
      )}
    </>
  );
}
