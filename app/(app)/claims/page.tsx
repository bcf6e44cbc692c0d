import type { Metadata } from 'next';
import { ButtonLink } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireRole } from '@/lib/auth/session';

export const metadata: Metadata = { title: 'Claims' };

export default async function ClaimsPage() {
  const user = await requireRole('dealer', 'dealer_admin');
  return (
    <>
      <PageHeader title="Claims" lead={`Warranty claims filed by ${user.orgName}.`} actions={<ButtonLink href="/claims/new">New claim</ButtonLink>} />
      <EmptyState title="No claims yet" action={<ButtonLink href="/claims/new">File the first claim</ButtonLink>}>
        Every warranty claim your shop files will be listed here with where it stands: waiting for the brand, more evidence
        asked for, approved with its RMA number, the replacement on its way, and the credit.
      </EmptyState>
    </>
  );
}
