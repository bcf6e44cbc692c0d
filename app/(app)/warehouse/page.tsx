import type { Metadata } from 'next';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireRole } from '@/lib/auth/session';

export const metadata: Metadata = { title: 'Shipping & cores' };

export default async function WarehousePage() {
  const user = await requireRole('warehouse');
  return (
    <>
      <PageHeader title="Shipping & cores" lead={`Replacements to send and failed parts coming back to ${user.orgName}.`} />
      <EmptyState title="Nothing to ship or receive">
        Approved claims appear here with their RMA numbers: pick and ship the replacement, print the packing slip, then
        receive the core when the dealer sends it back and record your inspection.
      </EmptyState>
    </>
  );
}
