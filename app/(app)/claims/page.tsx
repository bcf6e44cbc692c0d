import type { Metadata } from 'next';
import { ClaimsTable } from '@/components/claims/claims-table';
import { ButtonLink } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireRole } from '@/lib/auth/session';
import { hasAnyClaim } from '@/lib/db/claim-list';

export const metadata: Metadata = { title: 'Claims' };

export default async function ClaimsPage() {
  const user = await requireRole('dealer', 'dealer_admin');
  const any = await hasAnyClaim(user);
  return (
    <>
      <PageHeader title="Claims" lead={`Warranty claims filed by ${user.orgName}.`} actions={<ButtonLink href="/claims/new">New claim</ButtonLink>} />
      {any ? (
        <ClaimsTable />
      ) : (
        <EmptyState title="No claims yet" action={<ButtonLink href="/claims/new">File the first claim</ButtonLink>}>
          Every warranty claim your shop files will be listed here with where it stands: waiting for the brand, more evidence
          asked for, approved with its RMA number, the replacement on its way, and the credit.
        </EmptyState>
      )}
    </>
  );
}
