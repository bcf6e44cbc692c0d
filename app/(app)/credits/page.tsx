import type { Metadata } from 'next';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireRole } from '@/lib/auth/session';

export const metadata: Metadata = { title: 'Credits' };

export default async function DealerCreditsPage() {
  const user = await requireRole('dealer_admin');
  return (
    <>
      <PageHeader title="Credits" lead={`What the brands owe ${user.orgName}, and what they charged back.`} />
      <EmptyState title="No credit memos yet">
        Each credit memo a brand issues for your claims will be listed here by brand, with its lines and any open chargeback,
        ready to download for your books.
      </EmptyState>
    </>
  );
}
