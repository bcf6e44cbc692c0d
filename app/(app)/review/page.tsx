import type { Metadata } from 'next';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireRole } from '@/lib/auth/session';

export const metadata: Metadata = { title: 'Review queue' };

export default async function ReviewPage() {
  const user = await requireRole('brand_rep');
  return (
    <>
      <PageHeader title="Review queue" lead={`Claims filed against ${user.orgName}.`} />
      <EmptyState title="Nothing to review">
        Claims dealers submit against your brand will line up here, oldest deadline first, with the business days left to
        decide each one. Take a claim to review it; ask for more, approve or deny.
      </EmptyState>
    </>
  );
}
